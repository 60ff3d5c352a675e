import { createHash, randomUUID } from "node:crypto";
import { afterAll, describe, expect, test } from "vitest";
import { AppError } from "@/lib/errors";
import { closeDb, getDb } from "@/server/db";
import { clientIp, consume, LIMITS, resetLimit, tooManyMessage, type LimitName } from "@/server/auth/rate-limit";
import { rateLimits } from "@/server/db/schema";
import { eq, like } from "drizzle-orm";

// Runs against the test MariaDB's rate_limits table (DATABASE_URL from npm test).
const key = `rl-${randomUUID()}@example.test`;

afterAll(async () => {
  await resetLimit("mailIp", key);
  await closeDb();
});

/** The row a limit keeps for a key: `name:` and the SHA-256 (base64url) of the lower-cased key. */
const rowKey = (name: string, ...parts: string[]) =>
  `${name}:${createHash("sha256").update(parts.join("\n").toLowerCase()).digest("base64url")}`;

/** Runs `fn` while the cached limiter `name` refuses every try with `refusal`, then puts the real one back. */
async function withLimiter<T>(name: LimitName, refusal: unknown, fn: () => Promise<T>): Promise<T> {
  const cache = globalThis as unknown as { frameforkLimiters?: Map<LimitName, unknown> };
  cache.frameforkLimiters ??= new Map();
  const real = cache.frameforkLimiters.get(name);
  cache.frameforkLimiters.set(name, { consume: () => Promise.reject(refusal) });
  try {
    return await fn();
  } finally {
    if (real === undefined) cache.frameforkLimiters.delete(name);
    else cache.frameforkLimiters.set(name, real);
  }
}

describe("rate limits", () => {
  test("allow the configured tries, then refuse with the wait in minutes, then forget after a reset", async () => {
    const { points } = LIMITS.mailIp;
    for (let i = 0; i < points; i++) await consume([["mailIp", key]]);
    const refused = await consume([["mailIp", key]]).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(AppError);
    expect((refused as AppError).code).toBe("rate_limited");
    expect((refused as AppError).status).toBe(429);
    expect((refused as AppError).message).toMatch(/^Too many attempts, try again in (1[0-5]|[1-9]) minutes?\.$/);
    expect(Number((refused as AppError).headers?.["Retry-After"])).toBeGreaterThan(0);

    // One row, under a hash: the e-mail is not stored as typed.
    const rows = await getDb()
      .select()
      .from(rateLimits)
      .where(eq(rateLimits.key, rowKey("mailIp", key)));
    expect(rows).toHaveLength(1);
    expect(rows[0]?.points).toBe(points + 1);
    expect(
      await getDb()
        .select()
        .from(rateLimits)
        .where(like(rateLimits.key, `%${key}%`)),
    ).toEqual([]);

    await resetLimit("mailIp", key);
    await expect(consume([["mailIp", key]])).resolves.toBeUndefined();
  });

  test("keys are case-blind, so changing case does not buy more tries", async () => {
    const other = `RL-${randomUUID()}@Example.test`;
    for (let i = 0; i < LIMITS.mailIp.points; i++) await consume([["mailIp", i % 2 ? other : other.toLowerCase()]]);
    await expect(consume([["mailIp", other.toUpperCase()]])).rejects.toThrow(/Too many attempts/);
    await resetLimit("mailIp", other);
  });

  test("the longest e-mail with an address is counted like any other, not a database error", async () => {
    // 253 characters: past the table's 255-character key once a limit's name is put before it.
    const long = `${"a".repeat(64)}@${["b", "c", "d"].map((c) => c.repeat(60)).join(".")}.test`;
    expect(long.length).toBeGreaterThan(250);
    const address = "2001:db8:ffff:ffff:ffff:ffff:ffff:ffff";
    for (let i = 0; i < LIMITS.passwordAccountIp.points; i++) await consume([["passwordAccountIp", long, address]]);
    await expect(consume([["passwordAccountIp", long, address]])).rejects.toThrow(/Too many attempts/);
    await resetLimit("passwordAccountIp", long, address);
  });

  test("a refused try spends nothing of the limits listed after the one that refused", async () => {
    const own = `own-${randomUUID()}`;
    const shared = `shared-${randomUUID()}`;
    for (let i = 0; i < LIMITS.passwordAccountIp.points; i++) await consume([["passwordAccountIp", own]]);
    for (let i = 0; i < 5; i++) {
      await expect(
        consume([
          ["passwordAccountIp", own],
          ["passwordIp", shared],
        ]),
      ).rejects.toThrow(/Too many attempts/);
    }
    expect(
      await getDb()
        .select()
        .from(rateLimits)
        .where(eq(rateLimits.key, rowKey("passwordIp", shared))),
    ).toEqual([]);
    await resetLimit("passwordAccountIp", own);
  });

  test("a refusal made by another bundle's copy of the library is still a 429, not a crash", async () => {
    // Next bundles rate-limiter-flexible twice (route handlers; pages and actions) while the
    // limiters live on globalThis: a limiter made by one bundle refuses with an object of the
    // other bundle's class. A plain object of the same shape stands for it here.
    const { RateLimiterRes } = await import("rate-limiter-flexible");
    const foreignRefusal = {
      msBeforeNext: 4 * 60_000,
      remainingPoints: 0,
      consumedPoints: 21,
      isFirstInDuration: false,
    };
    expect(foreignRefusal).not.toBeInstanceOf(RateLimiterRes);
    const refused = await withLimiter("mailIp", foreignRefusal, () => consume([["mailIp", "203.0.113.9"]])).catch(
      (e: unknown) => e,
    );
    expect(refused).toBeInstanceOf(AppError);
    expect((refused as AppError).status).toBe(429);
    expect((refused as AppError).message).toBe("Too many attempts, try again in 4 minutes.");
  });

  test("a database failure inside a limiter is not mistaken for a refusal", async () => {
    const failure = new Error("connect ECONNREFUSED 127.0.0.1:3317");
    await expect(withLimiter("signUpIp", failure, () => consume([["signUpIp", "203.0.113.10"]]))).rejects.toBe(failure);
  });

  test("messages", () => {
    expect(tooManyMessage(1)).toBe("Too many attempts, try again in 1 minute.");
    expect(tooManyMessage(14 * 60_000 + 1)).toBe("Too many attempts, try again in 15 minutes.");
  });

  test("rotating X-Forwarded-For does not change the address when no proxy is trusted", () => {
    // The server appends the connection's address (127.0.0.1 here) to whatever the client sent.
    const seen = new Set(
      ["203.0.113.1", "203.0.113.2", "198.51.100.9, 203.0.113.3", ""].map((claimed) =>
        clientIp(new Headers({ "x-forwarded-for": claimed ? `${claimed}, 127.0.0.1` : "127.0.0.1" }), 0),
      ),
    );
    expect([...seen]).toEqual(["127.0.0.1"]);
    // TRUSTED_PROXY_HOPS is unset in the tests: no proxy is the default.
    expect(clientIp(new Headers({ "x-forwarded-for": "203.0.113.7, 10.0.0.1" }))).toBe("10.0.0.1");
  });

  test("with trusted proxies, the client is that many entries from the right", () => {
    const chain = { "x-forwarded-for": "198.51.100.66, 203.0.113.7, 10.0.0.2, 10.0.0.1" };
    expect(clientIp(chain, 0)).toBe("10.0.0.1");
    expect(clientIp(chain, 1)).toBe("10.0.0.2");
    expect(clientIp(chain, 2)).toBe("203.0.113.7");
    // What the client wrote to the left of the trusted hops never counts.
    expect(clientIp({ "x-forwarded-for": "1.1.1.1, 203.0.113.7, 10.0.0.2, 10.0.0.1" }, 2)).toBe("203.0.113.7");
    // Fewer entries than trusted hops (a request that skipped a proxy): the farthest one there is.
    expect(clientIp({ "x-forwarded-for": "10.0.0.1" }, 2)).toBe("10.0.0.1");
    // Headers other than X-Forwarded-For are the client's own words.
    expect(clientIp({ "x-real-ip": "198.51.100.2" })).toBe("unknown");
    expect(clientIp({})).toBe("unknown");
  });
});
