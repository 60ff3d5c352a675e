import { afterAll, describe, expect, test } from "vitest";
import { GET } from "@/app/api/characters/[id]/graph/route";
import { explorePaths, graphSchema, type MoveGraph } from "@/lib/engine";
import { closeDb } from "@/server/db";
import { getCharacterBySlug, getGameBySlug } from "@/server/db/queries/games";
import { DEMO_GAME } from "@/server/db/seed/demo";

// Reads the seeded test database that `npm test` prepares.
afterAll(closeDb);

async function tarrowId() {
  const game = await getGameBySlug({ slug: "vesper-circuit" });
  const c = game && (await getCharacterBySlug({ gameId: game.id, slug: "tarrow" }));
  if (!c) throw new Error("demo data missing");
  return c.id;
}

const get = (id: string | number, query = "") =>
  GET(new Request(`http://test/api/characters/${id}/graph${query}`), { params: Promise.resolve({ id: String(id) }) });

describe("GET /api/characters/[id]/graph", () => {
  test("returns the newest Edition's graph in the engine's shape, ready to explore", async () => {
    const res = await get(await tarrowId());
    expect(res.status).toBe(200);
    const body = (await res.json()) as {
      edition: { slug: string };
      graph: MoveGraph;
      roots: string[];
      game: { fastest: number };
    };
    expect(body.edition.slug).toBe("1-1");
    expect(body.game.fastest).toBe(DEMO_GAME.fastest);
    expect(graphSchema.safeParse(body.graph).success).toBe(true);
    expect(body.roots).toContain("n");
    expect(body.roots).not.toContain("n.v");

    // v.v.t cancelled into Ember Guard: -14 → -3 in 1.1, 11 frames saved.
    const cancelled = explorePaths(body.graph, "v").find((p) => p.input === "v.v.t~press");
    expect(cancelled).toMatchObject({ endsIn: "stance", onBlock: -3, framesSaved: 11, blockClass: "safe" });
  });

  test("an older Edition by slug has its own numbers", async () => {
    const res = await get(await tarrowId(), "?edition=1-0");
    const body = (await res.json()) as { graph: MoveGraph };
    const cancelled = explorePaths(body.graph, "v").find((p) => p.input === "v.v.t~press");
    expect(cancelled?.onBlock).toBe(-4);
  });

  test("bad ids and unknown Editions are 400 and 404 with a message, never 500", async () => {
    const id = await tarrowId();
    const bad = await get("abc");
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { error: { message: string } }).error.message).toMatch(/positive whole number/);
    expect((await get(id, "?edition=<script>")).status).toBe(400);
    expect((await get(id, "?edition=9-9")).status).toBe(404);
    expect((await get(987_654_321)).status).toBe(404);
  });
});
