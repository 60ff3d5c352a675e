import { randomUUID } from "node:crypto";
import { afterAll, describe, expect, test } from "vitest";
import { AppError } from "@/lib/errors";
import { closeDb, getDb } from "@/server/db";
import { clientIp, consume, LIMITS, resetLimit, tooManyMessage } from "@/server/auth/rate-limit";
import { rateLimits } from "@/server/db/schema";
import { like } from "drizzle-orm";

// Runs against the test MariaDB's rate_limits table (DATABASE_URL from npm test).
const key = `rl-${randomUUID()}@example.test`;

afterAll(async () => {
  await resetLimit("mailEmail", key);
  await closeDb();
});

describe("rate limits", () => {
  test("allow the configured tries, then refuse with the wait in minutes, then forget after a reset", async () => {
    const { points } = LIMITS.mailEmail;
    for (let i = 0; i < points; i++) await consume([["mailEmail", key]]);
    const refused = await consume([["mailEmail", key]]).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(AppError);
    expect((refused as AppError).code).toBe("rate_limited");
    expect((refused as AppError).status).toBe(429);
    expect((refused as AppError).message).toMatch(/^Too many attempts, try again in (1[0-5]|[1-9]) minutes?\.$/);

    const rows = await getDb()
      .select()
      .from(rateLimits)
      .where(like(rateLimits.key, `%${key}`));
    expect(rows).toHaveLength(1);
    expect(rows[0]?.points).toBe(points + 1);

    await resetLimit("mailEmail", key);
    await expect(consume([["mailEmail", key]])).resolves.toBeUndefined();
  });

  test("keys are case-blind, so changing case does not buy more tries", async () => {
    const other = `RL-${randomUUID()}@Example.test`;
    for (let i = 0; i < LIMITS.mailEmail.points; i++)
      await consume([["mailEmail", i % 2 ? other : other.toLowerCase()]]);
    await expect(consume([["mailEmail", other.toUpperCase()]])).rejects.toThrow(/Too many attempts/);
    await resetLimit("mailEmail", other);
  });

  test("messages and client addresses", () => {
    expect(tooManyMessage(1)).toBe("Too many attempts, try again in 1 minute.");
    expect(tooManyMessage(14 * 60_000 + 1)).toBe("Too many attempts, try again in 15 minutes.");
    expect(clientIp(new Headers({ "x-forwarded-for": "203.0.113.7, 10.0.0.1" }))).toBe("203.0.113.7");
    expect(clientIp({ "x-real-ip": "198.51.100.2" })).toBe("198.51.100.2");
    expect(clientIp({})).toBe("unknown");
  });
});
