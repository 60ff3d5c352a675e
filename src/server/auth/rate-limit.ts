import "server-only";
import type { Pool as PromisePool } from "mysql2/promise";
import { RateLimiterMySQL } from "rate-limiter-flexible";
import { env } from "@/env";
import { AppError } from "@/lib/errors";
import { getDb } from "@/server/db";

/** What each limit counts, and how many tries it allows in how long. */
export const LIMITS = {
  signInEmail: { points: 10, duration: 15 * 60 },
  signInIp: { points: 50, duration: 15 * 60 },
  signUpIp: { points: 10, duration: 60 * 60 },
  mailEmail: { points: 5, duration: 15 * 60 },
  mailIp: { points: 20, duration: 15 * 60 },
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
 * does not spare the others) and throws AppError "rate_limited" when any is over.
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
  if (wait > 0) throw new AppError("rate_limited", tooManyMessage(wait));
}

/** Forgets the tries counted for one key (tests, and a successful sign-in for its e-mail). */
export async function resetLimit(name: LimitName, key: string): Promise<void> {
  await limiter(name).delete(key.toLowerCase());
}

/** The client's address as the app sees it: the first X-Forwarded-For entry set by the proxy in front. */
export function clientIp(headers: Headers | Record<string, string | string[] | undefined>): string {
  const get = (name: string): string | undefined => {
    if (headers instanceof Headers) return headers.get(name) ?? undefined;
    const v = headers[name];
    return Array.isArray(v) ? v[0] : v;
  };
  const forwarded = get("x-forwarded-for")?.split(",")[0]?.trim();
  return forwarded || get("x-real-ip")?.trim() || "unknown";
}
