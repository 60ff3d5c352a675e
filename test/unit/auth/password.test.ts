import { parseOptions } from "@node-rs/argon2";
import { describe, expect, test } from "vitest";
import {
  hashPassword,
  newPasswordSchema,
  PASSWORD_MAX,
  PASSWORD_MIN,
  verifyAgainstDummy,
  verifyPassword,
} from "@/server/auth/password";

describe("passwords", () => {
  test("are stored as argon2id PHC strings with a fresh salt, and verify", async () => {
    const a = await hashPassword("correct horse battery");
    const b = await hashPassword("correct horse battery");
    // PHC string format of the argon2 reference (RFC 9106 names argon2id as the one to use).
    expect(a).toMatch(/^\$argon2id\$v=19\$m=\d+,t=\d+,p=\d+\$[A-Za-z0-9+/]+\$[A-Za-z0-9+/]+$/);
    expect(parseOptions(a).algorithm).toBe(parseOptions(b).algorithm);
    expect(a).not.toBe(b);
    expect(await verifyPassword(a, "correct horse battery")).toBe(true);
    expect(await verifyPassword(a, "correct horse batterY")).toBe(false);
    expect(await verifyPassword(a, "")).toBe(false);
  });

  test("a malformed stored hash is no match rather than an error", async () => {
    expect(await verifyPassword("not-a-hash", "whatever at all")).toBe(false);
    expect(await verifyAgainstDummy("anything-at-all")).toBe(false);
  });

  test(`must be ${PASSWORD_MIN} to ${PASSWORD_MAX} characters`, async () => {
    expect(newPasswordSchema.safeParse("x".repeat(PASSWORD_MIN - 1)).success).toBe(false);
    expect(newPasswordSchema.safeParse("x".repeat(PASSWORD_MIN)).success).toBe(true);
    expect(newPasswordSchema.safeParse("x".repeat(PASSWORD_MAX)).success).toBe(true);
    expect(newPasswordSchema.safeParse("x".repeat(PASSWORD_MAX + 1)).success).toBe(false);
    expect(newPasswordSchema.safeParse("short").error?.issues[0]?.message).toBe(
      "Use at least 10 characters for your password.",
    );
    await expect(hashPassword("short")).rejects.toThrow();
    expect(await verifyPassword(await hashPassword("x".repeat(PASSWORD_MAX)), "x".repeat(PASSWORD_MAX + 1))).toBe(
      false,
    );
  });
});
