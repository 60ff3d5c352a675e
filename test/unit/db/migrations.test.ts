import { getTableConfig } from "drizzle-orm/mysql-core";
import { eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { openDb, type Database } from "@/server/db";
import { migrateDatabase } from "@/server/db/migrate";
import * as schema from "@/server/db/schema";
import { isPublishedEditionWrite } from "@/server/db/published";
import { seedDemo } from "@/server/db/seed";
import { createThrowawayDatabase } from "./throwaway";

const TABLES = [schema.games, schema.editions, schema.characters, schema.stances, schema.moves, schema.edges];

let throwaway: Awaited<ReturnType<typeof createThrowawayDatabase>>;
let db: Database;
let close: () => Promise<void>;

beforeAll(async () => {
  throwaway = await createThrowawayDatabase();
  ({ db, close } = openDb(throwaway.url));
});

afterAll(async () => {
  await close?.();
  await throwaway?.drop();
});

/** A draft Edition of the demo game (the seeded ones are published), for writes of a test's own. */
async function draftEdition() {
  const [game] = await db.select({ id: schema.games.id }).from(schema.games).limit(1);
  const slug = `draft-${Math.random().toString(36).slice(2, 8)}`;
  await db.insert(schema.editions).values({ gameId: game!.id, slug, name: "Draft", releasedOn: new Date() });
  const [edition] = await db.select().from(schema.editions).where(eq(schema.editions.slug, slug));
  return edition!;
}

async function counts() {
  const out: Record<string, number> = {};
  for (const table of TABLES) {
    const [row] = await db.select({ n: sql<number>`count(*)` }).from(table);
    out[getTableConfig(table).name] = Number(row?.n);
  }
  return out;
}

describe("migrations and seed on an empty database", () => {
  test("the committed migrations create every table of the schema", async () => {
    const [before] = await db.execute(sql`show tables`);
    expect(before).toEqual([]);

    await migrateDatabase(throwaway.url);

    const [rows] = await db.execute<Record<string, string>>(sql`show tables`);
    const names = (rows as unknown as Record<string, string>[]).map((r) => Object.values(r)[0]);
    for (const table of TABLES) expect(names).toContain(getTableConfig(table).name);
    // Applying again is a no-op, not an error.
    await expect(migrateDatabase(throwaway.url)).resolves.toBeUndefined();
  });

  test("seeding twice leaves the same rows with the same ids", async () => {
    await seedDemo(db);
    const first = await counts();
    const idsBefore = await db
      .select({ id: schema.moves.id, key: schema.moves.key })
      .from(schema.moves)
      .orderBy(schema.moves.id);

    await seedDemo(db);
    expect(await counts()).toEqual(first);
    const idsAfter = await db
      .select({ id: schema.moves.id, key: schema.moves.key })
      .from(schema.moves)
      .orderBy(schema.moves.id);
    expect(idsAfter).toEqual(idsBefore);
    expect(first.moves).toBeGreaterThanOrEqual(3 * 25 * 2);
  });

  test("the demo's Editions are published, so the database refuses a change to them", async () => {
    const published = await db.select().from(schema.editions);
    expect(published.map((e) => e.status)).toEqual(["published", "published"]);
    await expect(
      db.update(schema.moves).set({ damage: 1 }).where(eq(schema.moves.editionId, published[0]!.id)),
    ).rejects.toSatisfy(isPublishedEditionWrite);
  });

  test("JSON columns round-trip numbers, states with frames, and lists", async () => {
    const edition = await draftEdition();
    const [character] = await db.select().from(schema.characters).limit(1);
    if (!edition || !character) throw new Error("seed wrote no edition or character");
    const outcome = { state: "knockdown" as const, frames: -3 };
    await db.insert(schema.moves).values({
      editionId: edition.id,
      characterId: character.id,
      key: "json-check",
      input: "json-check",
      name: "JSON check",
      level: "mid",
      damage: 1,
      onBlock: -12,
      onHit: outcome,
      onCounterHit: { state: "launch" },
      tags: ["a", "b c", "ünïcode"],
    });
    const [row] = await db.select().from(schema.moves).where(eq(schema.moves.key, "json-check"));
    expect(row?.onBlock).toBe(-12);
    expect(row?.onHit).toEqual(outcome);
    expect(row?.onCounterHit).toEqual({ state: "launch" });
    expect(row?.tags).toEqual(["a", "b c", "ünïcode"]);
    await db.delete(schema.moves).where(eq(schema.moves.key, "json-check"));
  });

  test("the database refuses an edge whose ends do not fit its kind", async () => {
    const edition = await draftEdition();
    const [stance] = await db.select().from(schema.stances).limit(1);
    const [move] = await db.select().from(schema.moves).limit(1);
    if (!edition || !stance || !move) throw new Error("seed wrote no rows");
    // A follow must go move → move; this one goes to a stance.
    await expect(
      db.insert(schema.edges).values({
        editionId: edition.id,
        characterId: move.characterId,
        key: "bad-follow",
        kind: "follow",
        fromMoveId: move.id,
        toStanceId: stance.id,
        input: ",1",
        gapOnBlock: 0,
        comboOnHit: true,
        comboOnCounterHit: true,
      }),
    ).rejects.toSatisfy((e: unknown) => /edges_follow_ends/.test(String((e as Error).cause)));
    const left = await db.select().from(schema.edges).where(eq(schema.edges.key, "bad-follow"));
    expect(left).toEqual([]);
  });
});
