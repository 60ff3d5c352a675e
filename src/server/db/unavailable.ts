import "server-only";
import { sql } from "drizzle-orm";
import { AppError } from "@/lib/errors";
import { getDb } from "./index";

/** What a page, a route and a form say while MariaDB is down or restarting. */
export const DATABASE_DOWN_MESSAGE = "The database is not answering. Try again in a few seconds.";

/** Seconds a client is told to wait (Retry-After) before trying again. */
export const RETRY_AFTER_SECONDS = 5;

// mysql2's and Node's codes for "the server is not there": refused, reset, lost, timed out,
// shutting down, killed by the shutdown, too many connections. A query the server refused
// (a constraint, bad SQL) is not among them: that stays a bug or a user's mistake.
const DOWN_CODES = new Set([
  "ECONNREFUSED",
  "ECONNRESET",
  "EPIPE",
  "ETIMEDOUT",
  "EHOSTUNREACH",
  "ENETUNREACH",
  "ENOTFOUND",
  "EAI_AGAIN",
  "PROTOCOL_CONNECTION_LOST",
  "PROTOCOL_SEQUENCE_TIMEOUT",
  "ER_CON_COUNT_ERROR",
  "ER_SERVER_SHUTDOWN",
  "ER_CONNECTION_KILLED",
  "ER_QUERY_INTERRUPTED",
]);

/**
 * Whether an error means MariaDB is not answering, rather than that a query
 * was wrong. Drizzle wraps the driver's error in `cause`; mysql2 marks every
 * error that closed a connection `fatal`.
 */
export function isDatabaseDown(error: unknown): boolean {
  for (let e: unknown = error, depth = 0; e instanceof Error && depth < 5; e = e.cause, depth++) {
    const { code, fatal } = e as { code?: unknown; fatal?: unknown };
    if (fatal === true) return true;
    if (typeof code === "string" && DOWN_CODES.has(code)) return true;
    if (e instanceof AggregateError && e.errors.some(isDatabaseDown)) return true;
  }
  return false;
}

/** The error routes and forms answer with while the database is down: 503 in our format. */
export function databaseUnavailable(): AppError {
  return new AppError("unavailable", DATABASE_DOWN_MESSAGE);
}

let ping: Promise<boolean> | null = null;

/**
 * Whether MariaDB answers a trivial query now. Requests that ask at the same
 * moment share one ping, so a burst of page loads during an outage costs one
 * connection attempt, not one each.
 */
export function databaseAnswers(): Promise<boolean> {
  ping ??= getDb()
    .execute(sql`select 1`)
    .then(
      () => true,
      (error: unknown) => {
        if (!isDatabaseDown(error)) console.error("[db] health ping failed:", error);
        return false;
      },
    )
    .finally(() => {
      ping = null;
    });
  return ping;
}
