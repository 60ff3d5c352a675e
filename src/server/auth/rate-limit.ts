import "server-only";
import type { Pool as PromisePool } from "mysql2/promise";
import { RateLimiterMySQL } from "rate-limiter-flexible";
import { env } from "@/env";
import { RateLimitedError } from "@/lib/errors";
import { getDb } from "@/server/db";

/** What each limit counts, and how many tries it allows in how long. */
export const LIMITS = {
  signInEmail: { points: 10, duration: 15 * 60 },
  signInIp: { points: 50, duration: 15 * 60 },
  signUpIp: { points: 10, duration: 60 * 60 },
  mailEmail: { points: 5, duration: 15 * 60 },
  mailIp: { points: 20, duration: 15 * 60 },
  // POST /api/paths computes on a posted graph for anyone (up to half a second of CPU each):
  // a person calling it by hand never comes near these, a script looping on it stops.
  pathsIpMinute: { points: 30, duration: 60 },
  pathsIpHour: { points: 300, duration: 60 * 60 },
  // Each invite mails an address the team chose: enough for a coach to bring in a whole roster
  // in one sitting, and for a team's few coaches to do it together; a spammer stops at these.
  inviteUser: { points: 20, duration: 60 * 60 },
  inviteTeam: { points: 50, duration: 60 * 60 },
} as const satisfies Record<string, { points: number; duration: number }>;

export type LimitName = keyof typeof LIMITS;

const cache = globalThis as unknown as { frameforkLimiters?: Map<LimitName, RateLimiterMySQL> };

function limiter(name: LimitName): RateLimiterMySQL {
  cache.frameforkLimiters ??= new Map();
  let found = cache.frameforkLimiters.get(name);
  if (!found) {
    // rate-limiter-flexible speaks mysql2's callback API: hand it the pool under
    // drizzle's promise pool (getDb() is typed without drizzle's $client).
    const promisePool = (getDb() as unknown as { $client: PromisePool }).$client;
    found = new RateLimiterMySQL({
      storeClient: promisePool.pool,
      storeType: "pool",
      dbName: new URL(env().DATABASE_URL).pathname.slice(1),
      tableName: "rate_limits",
      tableCreated: true,
      keyPrefix: name,
      ...LIMITS[name],
    });
    cache.frameforkLimiters.set(name, found);
  }
  return found;
}

export function tooManyMessage(msBeforeNext: number): string {
  const minutes = Math.max(1, Math.ceil(msBeforeNext / 60_000));
  return `Too many attempts, try again in ${minutes} minute${minutes === 1 ? "" : "s"}.`;
}

/**
 * Whether a limiter refused a try. Known by its shape, not by `instanceof RateLimiterRes`:
 * the limiters are cached on `globalThis`, and Next bundles this library once for route
 * handlers and once for pages and actions, so a limiter made by one bundle refuses with
 * the other bundle's class.
 */
export function isOverLimit(error: unknown): error is { msBeforeNext: number; remainingPoints: number } {
  if (typeof error !== "object" || error === null) return false;
  const { msBeforeNext, remainingPoints } = error as Record<string, unknown>;
  return typeof msBeforeNext === "number" && typeof remainingPoints === "number";
}

/**
 * Counts one try against each named limit (all of them, so one over the limit
 * does not spare the others) and throws RateLimitedError (429) when any is over.
 */
export async function consume(checks: [LimitName, string][]): Promise<void> {
  let wait = 0;
  for (const [name, key] of checks) {
    try {
      await limiter(name).consume(key.toLowerCase());
    } catch (error) {
      if (!isOverLimit(error)) throw error;
      wait = Math.max(wait, error.msBeforeNext);
    }
  }
  if (wait > 0) throw new RateLimitedError(tooManyMessage(wait), Math.ceil(wait / 1000));
}

/** Forgets the tries counted for one key (tests, and a successful sign-in for its e-mail). */
export async function resetLimit(name: LimitName, key: string): Promise<void> {
  await limiter(name).delete(key.toLowerCase());
}

/**
 * The client's address, for the per-address limits. The server (scripts/serve.mjs) appends the
 * address of whoever opened the connection to X-Forwarded-For, as each proxy does, so the list
 * ends with the nearest hop. With `hops` trusted proxies in front (TRUSTED_PROXY_HOPS), the client
 * is the entry `hops` places from the right: 0 means no proxy, the connection's own address. Entries
 * further left were written by the client and prove nothing; a list shorter than `hops` (a request
 * that skipped a proxy) gives its first entry. This is Express's numeric `trust proxy` rule.
 */
export function clientIp(
  headers: Headers | Record<string, string | string[] | undefined>,
  hops: number = env().TRUSTED_PROXY_HOPS,
): string {
  const header = headers instanceof Headers ? headers.get("x-forwarded-for") : headers["x-forwarded-for"];
  const list = (Array.isArray(header) ? header.join(",") : (header ?? ""))
    .split(",")
    .map((entry) => entry.trim())
    .filter(Boolean);
  return list[Math.max(0, list.length - 1 - hops)] ?? "unknown";
}
