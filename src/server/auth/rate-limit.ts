import "server-only";
import { createHash } from "node:crypto";
import type { Pool as PromisePool } from "mysql2/promise";
import { RateLimiterMySQL } from "rate-limiter-flexible";
import { env } from "@/env";
import { RateLimitedError } from "@/lib/errors";
import { getDb } from "@/server/db";

/** What each limit counts, and how many tries it allows in how long. */
export const LIMITS = {
  // Passwords (sign-in, and the current password when changing it). Only wrong ones count: each
  // try takes its point first, so tries sent at the same moment all count, and a right password
  // gives it back. The tight limit is per account *and* address, so wrong passwords sent from an
  // attacker's address never refuse the owner's right one from theirs; the looser per-address
  // limit stops one address guessing across many accounts. No limit is per account alone.
  passwordAccountIp: { points: 10, duration: 15 * 60 },
  passwordIp: { points: 50, duration: 15 * 60 },
  signUpIp: { points: 10, duration: 60 * 60 },
  // Mail sent on a stranger's request, a budget per purpose (MAIL_LIMITS): tight per e-mail and
  // address, so one client cannot use up another's; a looser cap per e-mail against filling an
  // inbox from many addresses; and one per address over every purpose and e-mail.
  signInLinkEmailIp: { points: 3, duration: 15 * 60 },
  signInLinkEmail: { points: 10, duration: 60 * 60 },
  passwordResetEmailIp: { points: 3, duration: 15 * 60 },
  passwordResetEmail: { points: 10, duration: 60 * 60 },
  confirmAddressEmailIp: { points: 3, duration: 15 * 60 },
  confirmAddressEmail: { points: 10, duration: 60 * 60 },
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

/** One limit and what it counts per: an address, an e-mail, or both (`["passwordAccountIp", email, ip]`). */
export type Check = [LimitName, ...string[]];

/**
 * The stored key for one check's parts: case-blind, and hashed, so an e-mail and an address
 * together always fit the table's 255-character key and neither is stored as typed.
 */
function storedKey(parts: string[]): string {
  return createHash("sha256").update(parts.join("\n").toLowerCase()).digest("base64url");
}

/**
 * Counts one try against each limit in order and throws RateLimitedError (429) at the first one
 * that is spent, leaving the later ones untouched. So list the caller's own limits first and a
 * budget others share last: a refused try then spends nothing of what others share.
 */
export async function consume(checks: Check[]): Promise<void> {
  for (const [name, ...parts] of checks) {
    try {
      await limiter(name).consume(storedKey(parts));
    } catch (error) {
      if (!isOverLimit(error)) throw error;
      throw new RateLimitedError(tooManyMessage(error.msBeforeNext), Math.ceil(error.msBeforeNext / 1000));
    }
  }
}

/** Forgets the tries counted for one key. */
export async function resetLimit(...[name, ...parts]: Check): Promise<void> {
  await limiter(name).delete(storedKey(parts));
}

/**
 * Starts one password check for `email` from `ip`: takes a point from the password limits, or
 * throws RateLimitedError when one is spent. Call `succeeded()` when the password was right: the
 * account's wrong tries from this address are forgotten and this try's point is given back, so
 * the limits count wrong passwords only.
 */
export async function passwordAttempt(email: string, ip: string): Promise<{ succeeded(): Promise<void> }> {
  await consume([
    ["passwordAccountIp", email, ip],
    ["passwordIp", ip],
  ]);
  return {
    async succeeded() {
      await resetLimit("passwordAccountIp", email, ip);
      // Only this try's point: signing in to an account of one's own must not wipe wrong
      // passwords sent to other accounts from the same address.
      await limiter("passwordIp").reward(storedKey([ip]), 1);
    },
  };
}

/** Each kind of mail a stranger can ask for, and its own budgets in LIMITS. */
const MAIL_LIMITS = {
  signInLink: { emailIp: "signInLinkEmailIp", email: "signInLinkEmail" },
  passwordReset: { emailIp: "passwordResetEmailIp", email: "passwordResetEmail" },
  // Sign-up's confirmation link (or the note to an address that already has an account), and sending it again.
  confirmAddress: { emailIp: "confirmAddressEmailIp", email: "confirmAddressEmail" },
} as const satisfies Record<string, { emailIp: LimitName; email: LimitName }>;

export type MailPurpose = keyof typeof MAIL_LIMITS;

/**
 * Counts one request for mail of `purpose` to `email` from `ip`, or throws RateLimitedError. The
 * per-e-mail cap, the one budget other clients share, is spent last: only by requests that pass
 * the client's own limits, so being refused never eats into it.
 */
export async function limitMail(purpose: MailPurpose, email: string, ip: string): Promise<void> {
  const budgets = MAIL_LIMITS[purpose];
  await consume([
    [budgets.emailIp, email, ip],
    ["mailIp", ip],
    [budgets.email, email],
  ]);
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
