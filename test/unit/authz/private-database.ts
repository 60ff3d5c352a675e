import { sql } from "drizzle-orm";
import { afterAll, beforeAll } from "vitest";
import { env } from "@/env";
import { closeDb, getDb, openDb } from "@/server/db";
import { migrateDatabase } from "@/server/db/migrate";
import { seedDemo } from "@/server/db/seed";
import { createThrowawayDatabase } from "../db/throwaway";

/**
 * Gives the test file a database of its own, migrated and seeded with the demo, and points the
 * app's pool at it. Test files run in parallel on one MariaDB; in a database no other file
 * writes to, a checksum of every table tells exactly what one call wrote.
 * Call it at the top of the file, before anything opens the pool.
 */
export function runOnPrivateDatabase(): void {
  let throwaway: Awaited<ReturnType<typeof createThrowawayDatabase>> | undefined;
  const shared = process.env.DATABASE_URL;
  beforeAll(async () => {
    throwaway = await createThrowawayDatabase();
    await migrateDatabase(throwaway.url);
    const seeding = openDb(throwaway.url);
    await seedDemo(seeding.db);
    await seeding.close();
    await closeDb();
    process.env.DATABASE_URL = throwaway.url;
    if (env().DATABASE_URL !== throwaway.url)
      throw new Error("the environment was read before runOnPrivateDatabase(): call it before anything opens the pool");
  }, 120_000);
  afterAll(async () => {
    await closeDb();
    process.env.DATABASE_URL = shared;
    await throwaway?.drop();
  });
}

/** Tables whose rows change without anything being written for the caller: the rate limits' counters. */
const NOT_COUNTED = new Set(["rate_limits"]);

/**
 * One checksum per table (MariaDB's CHECKSUM TABLE: every row's content), rate limits aside.
 * Two equal results mean nothing was inserted, changed or deleted in between.
 */
export async function tableChecksums(): Promise<Record<string, string>> {
  const db = getDb();
  const [tables] = (await db.execute(sql`show tables`)) as unknown as [Record<string, string>[]];
  const names = tables.map((row) => Object.values(row)[0]!).filter((name) => !NOT_COUNTED.has(name));
  const [rows] = (await db.execute(
    sql.raw(`checksum table ${names.map((n) => `\`${n}\``).join(", ")}`),
  )) as unknown as [{ Table: string; Checksum: string | number | null }[]];
  return Object.fromEntries(rows.map((r) => [r.Table.split(".").pop()!, String(r.Checksum)]));
}
