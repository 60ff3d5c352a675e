import "server-only";
import { drizzle, type MySql2Database } from "drizzle-orm/mysql2";
import mysql from "mysql2/promise";
import { env } from "@/env";
import * as schema from "./schema";

export type Database = MySql2Database<typeof schema>;

// One pool per process. In development, hot reload re-evaluates this module,
// so the pool is kept on globalThis rather than opened again on every edit.
const cache = globalThis as unknown as { frameforkPool?: mysql.Pool; frameforkDb?: Database };

/** Opens the pool on first use, so `next build` never connects. */
export function getDb(): Database {
  if (!cache.frameforkDb) {
    cache.frameforkPool = mysql.createPool({
      uri: env().DATABASE_URL,
      connectionLimit: 10,
      // A stopped server refuses at once; one that hangs must not hold a request for
      // mysql2's default 10 s before the app can say the database is not answering.
      connectTimeout: 3_000,
      // A connection the server dropped (a restart) leaves the pool on its own; keep-alive
      // finds a silently dead one, so after an outage new connections are opened.
      enableKeepAlive: true,
      keepAliveInitialDelay: 10_000,
      // Drizzle maps JSON and dates itself; keep mysql2 from guessing.
      dateStrings: false,
      timezone: "Z",
      supportBigNumbers: true,
    });
    cache.frameforkDb = drizzle(cache.frameforkPool, { schema, mode: "default" });
  }
  return cache.frameforkDb;
}

/** Closes the pool (scripts and tests; the server keeps it for its lifetime). */
export async function closeDb(): Promise<void> {
  const pool = cache.frameforkPool;
  cache.frameforkPool = undefined;
  cache.frameforkDb = undefined;
  await pool?.end();
}

/** Opens a separate connection set on another URL (migration tests use throwaway databases). */
export function openDb(url: string): { db: Database; close: () => Promise<void> } {
  const pool = mysql.createPool({ uri: url, connectionLimit: 4, timezone: "Z", supportBigNumbers: true });
  return { db: drizzle(pool, { schema, mode: "default" }), close: () => pool.end() };
}
