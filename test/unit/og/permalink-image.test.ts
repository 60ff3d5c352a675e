import { describe, expect, test, vi } from "vitest";
import { createPermalink, loadSharedView, revokePermalink } from "@/server/db/queries/permalinks";
import { permalinkImageForSlug, renderPermalinkImage, summarizeSharedView } from "@/server/og";
import { renderPermalinkImage as drawn } from "@/server/og/permalink-image";
import { playerInTeam, stringView } from "../permalinks/fixtures";

// The drawing is counted, to see that a preview is drawn once.
vi.mock("@/server/og/permalink-image", async (original) => {
  const real = await original<typeof import("@/server/og/permalink-image")>();
  return { ...real, renderPermalinkImage: vi.fn(real.renderPermalinkImage) };
});

// PNG layout (W3C PNG spec, section 5): an 8-byte signature, then the IHDR chunk with width and height at bytes 16 and 20.
const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
async function png(res: Response) {
  const bytes = Buffer.from(await res.arrayBuffer());
  return { bytes, signature: [...bytes.subarray(0, 8)], width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) };
}

const ctx = playerInTeam("Player Ivo");

const share = (visibility: "team" | "link", view = stringView()) =>
  createPermalink({
    teamId: ctx.team,
    createdBy: ctx.player,
    characterId: ctx.characterId,
    editionSlug: "1-1",
    view,
    visibility,
  });

describe("summarizeSharedView", () => {
  test("outlines a public link's path from the engine: input, levels, on block and its class", async () => {
    const made = await share("link");
    const loaded = await loadSharedView({ slug: made.slug, viewerId: null });
    if (loaded.status !== "ok" || loaded.view.kind !== "explorer") throw new Error(loaded.status);
    // The seed's v.v.t is -14 on block in 1-1; with the demo's fastest 11 and launchAt 16, -16 < -14 <= -11 is punishable (DESIGN.md's block classes).
    expect(summarizeSharedView(loaded.view)).toEqual({
      kind: "path",
      title: "Tarrow · v.v.t · edition 1-1",
      input: "v.v.t",
      levels: loaded.view.data.graph.nodes.flatMap((n) =>
        ["v", "v.v", "v.v.t"].includes(n.id) && n.kind === "move" ? [n.level] : [],
      ),
      onBlock: "-14",
      blockClass: "punishable",
    });
  });

  test("a team-only link gets the generic card, even for a member", async () => {
    const made = await share("team");
    const loaded = await loadSharedView({ slug: made.slug, viewerId: ctx.player });
    if (loaded.status !== "ok") throw new Error(loaded.status);
    expect(summarizeSharedView(loaded.view)).toEqual({ kind: "private" });
  });
});

describe("renderPermalinkImage", () => {
  test("renders a 1200×630 PNG of a path", async () => {
    const image = await png(
      await renderPermalinkImage({
        kind: "path",
        title: "T · n.v · edition 1-1",
        input: "n.v",
        levels: ["high", "mid"],
        onBlock: "-3",
        blockClass: "safe",
      }),
    );
    expect(image.signature).toEqual(PNG_SIGNATURE);
    expect([image.width, image.height]).toEqual([1200, 630]);
  });

  test("renders a 1200×630 PNG of a stance sheet, unlike the generic card, with or without a way in", async () => {
    const generic = (await png(await renderPermalinkImage({ kind: "private" }))).bytes;
    for (const best of [{ input: "n.v~ebb", onBlock: "-1", blockClass: "safe" }, null]) {
      const image = await png(
        await renderPermalinkImage({
          kind: "stance",
          title: "Stance: S · T · edition 1-1",
          stance: "S",
          waysIn: 3,
          best,
        }),
      );
      expect(image.signature).toEqual(PNG_SIGNATURE);
      expect([image.width, image.height]).toEqual([1200, 630]);
      expect(image.bytes.equals(generic)).toBe(false);
    }
  });

  test("a team-only, a revoked-looking and an unknown slug all give the same generic image", async () => {
    const generic = (await png(await renderPermalinkImage({ kind: "private" }))).bytes;
    const teamOnly = await share("team");
    expect((await png(await permalinkImageForSlug({ slug: teamOnly.slug }))).bytes.equals(generic)).toBe(true);
    expect((await png(await permalinkImageForSlug({ slug: "B".repeat(24) }))).bytes.equals(generic)).toBe(true);
    const open = await share("link");
    expect((await png(await permalinkImageForSlug({ slug: open.slug }))).bytes.equals(generic)).toBe(false);
  });

  test("a link's preview is drawn once, then sent from memory; revoked, it is the generic card at once", async () => {
    const generic = (await png(await renderPermalinkImage({ kind: "private" }))).bytes;
    const open = await share("link", stringView({ path: "v>v.v" }));
    const first = (await png(await permalinkImageForSlug({ slug: open.slug }))).bytes;
    vi.mocked(drawn).mockClear();
    const again = (await png(await permalinkImageForSlug({ slug: open.slug }))).bytes;
    expect(again.equals(first)).toBe(true);
    expect(drawn).not.toHaveBeenCalled();

    await revokePermalink({ slug: open.slug, actorId: ctx.player });
    expect((await png(await permalinkImageForSlug({ slug: open.slug }))).bytes.equals(generic)).toBe(true);
  });
});
