import { afterAll, describe, expect, test } from "vitest";
import { closeDb } from "@/server/db";
import { getCharacterBySlug, getGameBySlug, listCharacters, listEditions, listGames } from "@/server/db/queries/games";
import { getMoveList } from "@/server/db/queries/moves";
import { checkDatabase } from "@/server/db/queries/health";
import { DEMO_GAME } from "@/server/db/seed/demo";

// These read the seeded test database that `npm test` prepares.
afterAll(closeDb);

async function demo() {
  const game = await getGameBySlug({ slug: "vesper-circuit" });
  if (!game) throw new Error("the demo game is not in the test database");
  const editions = await listEditions({ gameId: game.id });
  const tarrow = await getCharacterBySlug({ gameId: game.id, slug: "tarrow" });
  if (!tarrow) throw new Error("no demo character tarrow");
  return { game, editions, tarrow };
}

describe("game queries", () => {
  test("list the demo game with its frame-rate settings", async () => {
    const games = await listGames();
    const game = games.find((g) => g.slug === "vesper-circuit");
    expect(game).toMatchObject({
      name: "Vesper Circuit",
      fps: DEMO_GAME.fps,
      fastest: DEMO_GAME.fastest,
      launchAt: DEMO_GAME.launchAt,
    });
  });

  test("editions come newest first", async () => {
    const { editions } = await demo();
    expect(editions.map((e) => e.slug)).toEqual(["1-1", "1-0"]);
    expect(editions[0]?.releasedOn).toBe("2026-09-14");
  });

  test("characters are listed by name; unknown slugs give null", async () => {
    const { game } = await demo();
    const cast = await listCharacters({ gameId: game.id });
    expect(cast.map((c) => c.name)).toEqual(["Brannoch", "Quessaline", "Tarrow"]);
    expect(await getCharacterBySlug({ gameId: game.id, slug: "nobody" })).toBeNull();
    expect(await getGameBySlug({ slug: "no-such-game" })).toBeNull();
  });

  test("the health check reaches MariaDB", async () => {
    expect(await checkDatabase()).toMatchObject({ ok: true });
  });
});

describe("getMoveList", () => {
  test("returns every move with its frames, level, stance and how it is reached", async () => {
    const { editions, tarrow } = await demo();
    const newest = editions[0];
    if (!newest) throw new Error("no edition");
    const list = await getMoveList({ characterId: tarrow.id, editionId: newest.id });

    expect(list.moves.length).toBeGreaterThanOrEqual(25);
    expect(list.stances.map((s) => s.name)).toEqual(["Drift", "Ember Guard"]);

    const byKey = new Map(list.moves.map((m) => [m.key, m]));
    const jab = byKey.get("n");
    expect(jab).toMatchObject({
      input: "n",
      level: "high",
      startup: 11,
      onBlock: 1,
      via: null,
      depth: 0,
      stance: null,
    });
    expect(byKey.get("n.v.t")).toMatchObject({
      level: "mid",
      onCounterHit: { state: "knockdown" },
      depth: 2,
      via: { kind: "follow", input: ".t", gapOnBlock: 3, comboOnHit: false, comboOnCounterHit: true },
    });
    const stanceMove = byKey.get("drift:v");
    expect(stanceMove?.stance?.name).toBe("Drift");
    expect(stanceMove?.via).toEqual({ kind: "enter", input: ":v" });

    const cancel = list.cancels.find((c) => c.key === "v.v.t~press>ember");
    expect(cancel).toMatchObject({
      input: "~press",
      onBlock: -3,
      autoGuard: ["high", "mid"],
      stance: { name: "Ember Guard" },
    });
    expect(cancel?.fromId).toBe(byKey.get("v.v.t")?.id);

    // Rows are DTOs: no database-only columns leak out.
    expect(Object.keys(jab ?? {})).not.toContain("editionId");
  });

  test("each edition has its own numbers", async () => {
    const { editions, tarrow } = await demo();
    const [newer, older] = await Promise.all(
      editions.map((e) => getMoveList({ characterId: tarrow.id, editionId: e.id })),
    );
    const shin = (l: typeof newer) => l?.moves.find((m) => m.key === "sink+r")?.onBlock;
    expect(shin(newer)).toBe(-13);
    expect(shin(older)).toBe(-12);
  });

  test("an edition of another game's character yields an empty list, not another character's rows", async () => {
    const { tarrow } = await demo();
    const list = await getMoveList({ characterId: tarrow.id, editionId: 999_999 });
    expect(list).toEqual({ stances: [], moves: [], cancels: [] });
  });
});
