import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { compareEditions } from "@/server/changes";
import { closeDb, getDb } from "@/server/db";
import { editions, games, moves } from "@/server/db/schema";
import { gameWithCharacter } from "../db/game-fixture";

// The "What changed" page keeps the comparison of two published Editions (frozen by the database),
// so paging and sorting do not compute the diff again; a draft's comparison is computed afresh
// each time, since its rows may change between two requests.

const db = getDb();
afterAll(closeDb);
const options = { fastest: 10, launchAt: 15 };

let characterId = 0;
const ids: Record<"one" | "two" | "draft", { id: number; status: "draft" | "published" }> = {
  one: { id: 0, status: "published" },
  two: { id: 0, status: "published" },
  draft: { id: 0, status: "draft" },
};

async function editionWith(gameId: number, slug: string, onBlock: number, publish: boolean) {
  const [edition] = await db
    .insert(editions)
    .values({ gameId, slug, name: slug, releasedOn: new Date("2026-11-01") })
    .$returningId();
  await db.insert(moves).values({
    editionId: edition!.id,
    characterId,
    key: "f+2",
    input: "f+2",
    name: "Ledger Strike",
    level: "mid",
    damage: 12,
    startup: 14,
    onBlock,
    onHit: 3,
    onCounterHit: 5,
    tags: [],
  });
  if (publish) await db.update(editions).set({ status: "published" }).where(eq(editions.id, edition!.id));
  return edition!.id;
}

let gameId = 0;

beforeAll(async () => {
  const made = await gameWithCharacter({ slug: "compare", name: "Compare" }, { slug: "ledger", name: "Ledger" });
  gameId = made.gameId;
  characterId = made.characterId;
  ids.one.id = await editionWith(gameId, "0-1", -8, true);
  ids.two.id = await editionWith(gameId, "0-2", -11, true);
  ids.draft.id = await editionWith(gameId, "0-3", -11, false);
});

afterAll(async () => {
  // Removing the game removes its Editions through the foreign keys, which fire no trigger.
  await db.delete(games).where(eq(games.id, gameId));
});

describe("compareEditions", () => {
  it("keeps the comparison of two published Editions: the second request reads the same one", async () => {
    const first = await compareEditions({ characterId, from: ids.one, to: ids.two, options });
    expect(first.phrases).toEqual(["1 move changed", "1 ending that was safe is now punishable"]);
    expect(await compareEditions({ characterId, from: ids.one, to: ids.two, options })).toBe(first);
    // Other rules are another comparison.
    const other = await compareEditions({
      characterId,
      from: ids.one,
      to: ids.two,
      options: { ...options, fastest: 12 },
    });
    expect(other).not.toBe(first);
  });

  it("computes a draft's comparison afresh, so an edit to the draft shows at once", async () => {
    const first = await compareEditions({ characterId, from: ids.two, to: ids.draft, options });
    expect(first.phrases).toEqual([]);
    await db
      .update(moves)
      .set({ onBlock: -15 })
      .where(and(eq(moves.editionId, ids.draft.id), eq(moves.key, "f+2")));
    const second = await compareEditions({ characterId, from: ids.two, to: ids.draft, options });
    expect(second).not.toBe(first);
    expect(second.phrases).toEqual(["1 move changed", "1 ending that was punishable is now launch-punishable"]);
  });
});
