import { afterAll, describe, expect, test, vi } from "vitest";
import { generateMetadata as exploreMetadata } from "@/app/(app)/games/[game]/[character]/explore/[move]/page";
import { decodeSegment } from "@/lib/segment";
import { closeDb } from "@/server/db";

// Pages get their dynamic segments percent-encoded and decode them; an address whose escapes
// do not decode (a stray "%E0") must be "not found", never an error thrown while rendering.

vi.mock("@/server/auth", () => import("../authz/session-mock"));
afterAll(closeDb);

describe("dynamic segments of an address", () => {
  test("decode as typed, and one that does not decode stays as it is", () => {
    expect(decodeSegment("1%2C2%2C3")).toBe("1,2,3");
    expect(decodeSegment("DRF%203")).toBe("DRF 3");
    expect(decodeSegment("%E0")).toBe("%E0");
    expect(decodeSegment("%E0%A4%A")).toBe("%E0%A4%A");
  });

  test("the Explorer's title for a move whose address does not decode is written, not thrown", async () => {
    const meta = await exploreMetadata({
      params: Promise.resolve({ game: "vesper-circuit", character: "tarrow", move: "%E0" }),
    } as PageProps<"/games/[game]/[character]/explore/[move]">);
    expect(meta.title).toBe("%E0 · Tarrow Explorer");
  });
});
