import "server-only";
import { sql } from "drizzle-orm";
import { getDb } from "../index";

export type DatabaseHealth = { ok: true; latencyMs: number } | { ok: false; error: string };

export async function checkDatabase(): Promise<DatabaseHealth> {
  const started = performance.now();
  try {
    await getDb().execute(sql`select 1`);
    return { ok: true, latencyMs: Math.round((performance.now() - started) * 10) / 10 };
  } catch (error) {
    // The reason goes to the server log; the client learns only that it failed.
    console.error("[health] database check failed:", error);
    return { ok: false, error: "database unreachable" };
  }
}
