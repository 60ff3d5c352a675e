import { randomUUID } from "node:crypto";
import { fc, test } from "@fast-check/vitest";
import { eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect } from "vitest";
import { closeDb, getDb } from "@/server/db";
import { isPublishedEditionWrite } from "@/server/db/published";
import { editions, edges, games, moves, stances } from "@/server/db/schema";
import { gameWithCharacter } from "./game-fixture";

// A published Edition never changes, and it is the database that says no: the triggers of
// drizzle/0004 refuse every insert, update and delete of its stances, moves and edges, and any
// change to the Edition row itself, whatever path the write takes. A draft takes the same writes.

afterAll(closeDb);
const db = getDb();

type Ids = Awaited<ReturnType<typeof editionWithRows>>;

/** An Edition of a game of its own with one character: a stance, two moves, and an edge of each kind. */
async function editionWithRows(gameId: number, characterId: number, slug: string) {
  const [edition] = await db
    .insert(editions)
    .values({ gameId, slug, name: `Edition ${slug}`, releasedOn: new Date("2026-11-01") })
    .$returningId();
  const editionId = edition!.id;
  const [stance] = await db
    .insert(stances)
    .values({ editionId, characterId, key: "drift", name: "Drift", abbreviation: "DRF" })
    .$returningId();
  const move = (key: string, stanceId: number | null = null) => ({
    editionId,
    characterId,
    key,
    input: key,
    name: `Move ${key}`,
    level: "mid" as const,
    damage: 10,
    startup: 12,
    onBlock: -4,
    onHit: 3,
    onCounterHit: 5,
    tags: [],
    stanceId,
  });
  const [first] = await db.insert(moves).values(move("1")).$returningId();
  const [second] = await db.insert(moves).values(move("1,2")).$returningId();
  const [fromStance] = await db.insert(moves).values(move("DRF 3", stance!.id)).$returningId();
  const edge = { editionId, characterId, fromMoveId: null, fromStanceId: null, toMoveId: null, toStanceId: null };
  const [follow] = await db
    .insert(edges)
    .values({
      ...edge,
      key: "1>1,2",
      kind: "follow",
      fromMoveId: first!.id,
      toMoveId: second!.id,
      input: ",2",
      gapOnBlock: 0,
      comboOnHit: true,
      comboOnCounterHit: true,
    })
    .$returningId();
  await db.insert(edges).values({
    ...edge,
    key: "1~drift",
    kind: "cancel",
    fromMoveId: first!.id,
    toStanceId: stance!.id,
    input: "~b",
    onBlock: 1,
    onHit: 6,
    onCounterHit: 8,
    autoGuard: ["high"],
  });
  await db.insert(edges).values({
    ...edge,
    key: "drift>DRF 3",
    kind: "enter",
    fromStanceId: stance!.id,
    toMoveId: fromStance!.id,
    input: "3",
  });
  return { editionId, stanceId: stance!.id, moveId: first!.id, followId: follow!.id };
}

/** Everything the Edition holds, as the database has it: compared before and after each refused write. */
async function snapshot(editionId: number) {
  return {
    edition: await db.select().from(editions).where(eq(editions.id, editionId)),
    stances: await db.select().from(stances).where(eq(stances.editionId, editionId)).orderBy(stances.id),
    moves: await db.select().from(moves).where(eq(moves.editionId, editionId)).orderBy(moves.id),
    edges: await db.select().from(edges).where(eq(edges.editionId, editionId)).orderBy(edges.id),
  };
}

/** Every kind of write to an Edition's rows, with arbitrary values where a value is written. */
const writes = {
  "insert a stance": (e: Ids, n: number) =>
    db
      .insert(stances)
      .values({ editionId: e.editionId, characterId: ctx.characterId, key: `s${n}`, name: "New", abbreviation: "NEW" }),
  "insert a move": (e: Ids, n: number) =>
    db.insert(moves).values({
      editionId: e.editionId,
      characterId: ctx.characterId,
      key: `m${n}`,
      input: `m${n}`,
      name: "New",
      level: "low",
      damage: n % 60,
      startup: 14,
      onBlock: -n,
      onHit: 2,
      onCounterHit: 4,
      tags: [],
    }),
  "insert an edge": (e: Ids, n: number) =>
    db.insert(edges).values({
      editionId: e.editionId,
      characterId: ctx.characterId,
      key: `e${n}`,
      kind: "follow",
      fromMoveId: e.moveId,
      toMoveId: e.moveId,
      input: ",1",
      gapOnBlock: n % 20,
      comboOnHit: false,
      comboOnCounterHit: false,
    }),
  "update a move's frames": (e: Ids, n: number) => db.update(moves).set({ onBlock: -n }).where(eq(moves.id, e.moveId)),
  "update a stance's name": (e: Ids, n: number) =>
    db
      .update(stances)
      .set({ name: `Drift ${n}` })
      .where(eq(stances.id, e.stanceId)),
  "update an edge's gap": (e: Ids, n: number) =>
    db
      .update(edges)
      .set({ gapOnBlock: n % 30 })
      .where(eq(edges.id, e.followId)),
  "update every move at once": (e: Ids, n: number) =>
    db
      .update(moves)
      .set({ damage: sql`${moves.damage} + ${(n % 5) + 1}` })
      .where(eq(moves.editionId, e.editionId)),
  "delete an edge": (e: Ids) => db.delete(edges).where(eq(edges.id, e.followId)),
  "delete a move": (e: Ids) => db.delete(moves).where(eq(moves.id, e.moveId)),
  "delete a stance": (e: Ids) => db.delete(stances).where(eq(stances.id, e.stanceId)),
  "rename the Edition": (e: Ids, n: number) =>
    db
      .update(editions)
      .set({ name: `Renamed ${n}` })
      .where(eq(editions.id, e.editionId)),
  "set the Edition back to draft": (e: Ids) =>
    db.update(editions).set({ status: "draft" }).where(eq(editions.id, e.editionId)),
  "delete the Edition": (e: Ids) => db.delete(editions).where(eq(editions.id, e.editionId)),
} as const;
type Write = keyof typeof writes;

const ctx = { gameId: 0, characterId: 0, published: null as unknown as Ids, draft: null as unknown as Ids };

beforeAll(async () => {
  const made = await gameWithCharacter({ slug: "frozen", name: "Frozen" }, { slug: "quill", name: "Quill" });
  ctx.gameId = made.gameId;
  ctx.characterId = made.characterId;
  ctx.published = await editionWithRows(ctx.gameId, ctx.characterId, "1-0");
  await db
    .update(editions)
    .set({ status: "published", publishedAt: new Date() })
    .where(eq(editions.id, ctx.published.editionId));
});

afterAll(async () => {
  // Removing the game removes its Editions through the foreign keys, which fire no trigger.
  await db.delete(games).where(eq(games.id, ctx.gameId));
});

describe("a published Edition", () => {
  test.prop({ write: fc.constantFrom(...(Object.keys(writes) as Write[])), n: fc.integer({ min: 1, max: 60 }) })(
    "refuses every kind of write at the database, and keeps every row as it was",
    async ({ write, n }) => {
      const before = await snapshot(ctx.published.editionId);
      const refusal = await writes[write](ctx.published, n).then(
        () => null,
        (error: unknown) => error,
      );
      expect(refusal, `${write} went through`).not.toBeNull();
      expect(isPublishedEditionWrite(refusal), String(refusal)).toBe(true);
      expect(await snapshot(ctx.published.editionId)).toEqual(before);
    },
  );

  test.prop({ n: fc.integer({ min: 1, max: 60 }) }, { numRuns: 3 })(
    "refuses a draft's row being moved into it",
    async ({ n }) => {
      const draft = await editionWithRows(ctx.gameId, ctx.characterId, `d${randomUUID().slice(0, 6)}`);
      const refusal = await db
        .update(moves)
        .set({ editionId: ctx.published.editionId, key: `moved-${n}` })
        .where(eq(moves.id, draft.moveId))
        .then(
          () => null,
          (error: unknown) => error,
        );
      expect(isPublishedEditionWrite(refusal), String(refusal)).toBe(true);
    },
  );
});

describe("a draft Edition", () => {
  // The same writes go through on a draft: the refusals above are the publishing's doing.
  test("takes every one of the writes, then freezes once published", async () => {
    for (const write of Object.keys(writes) as Write[]) {
      const draft = await editionWithRows(ctx.gameId, ctx.characterId, `d${randomUUID().slice(0, 6)}`);
      await expect(writes[write](draft, 7), write).resolves.toBeDefined();
    }
    const draft = await editionWithRows(ctx.gameId, ctx.characterId, `d${randomUUID().slice(0, 6)}`);
    await db.update(editions).set({ status: "published" }).where(eq(editions.id, draft.editionId));
    await expect(writes["update a move's frames"](draft, 3)).rejects.toSatisfy(isPublishedEditionWrite);
  });
});
