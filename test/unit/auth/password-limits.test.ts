import { randomBytes, randomUUID } from "node:crypto";
import { inArray } from "drizzle-orm";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import { AppError } from "@/lib/errors";
import { changePassword } from "@/app/(auth)/actions";
import { hashPassword } from "@/server/auth/password";
import { MISMATCH } from "@/lib/auth-messages";
import { authorizePassword } from "@/server/auth/options";
import { findUserByEmail } from "@/server/auth/queries";
import { LIMITS } from "@/server/auth/rate-limit";
import { closeDb, getDb } from "@/server/db";
import { users } from "@/server/db/schema";
import { setSession } from "../authz/session-mock";

// The password limits against the test MariaDB, through the real sign-in check and the real
// change-password action. Only the session and the caller's address are set by the test.
vi.mock("@/server/auth", () => import("../authz/session-mock"));
let actionAddress = "";
vi.mock("next/headers", () => ({ headers: async () => new Headers({ "x-forwarded-for": actionAddress }) }));

const PASSWORD = "stance-cancel-practice";
const made: string[] = [];

/** A fresh account, so no test shares its counts with another or with an earlier run. */
async function newAccount(): Promise<string> {
  const email = `pw-${randomUUID()}@example.test`;
  // A proven account: these tests are about counting passwords, not about proving addresses.
  await getDb()
    .insert(users)
    .values({ email, name: "Coach Lornavex", passwordHash: await hashPassword(PASSWORD), emailVerified: new Date() });
  made.push(email);
  return email;
}

/** A fresh address of the documentation range (one per run, so earlier runs' counts never meet it). */
const newAddress = () =>
  `2001:db8:${randomBytes(4)
    .toString("hex")
    .replace(/(....)(....)/, "$1:$2")}::1`;

/** Signs in from `ip`: "ok", "mismatch" or "limited". */
async function signIn(email: string, password: string, ip: string): Promise<"ok" | "mismatch" | "limited"> {
  try {
    await authorizePassword({ email, password }, { "x-forwarded-for": ip });
    return "ok";
  } catch (error) {
    if (error instanceof AppError && error.code === "rate_limited") return "limited";
    if (error instanceof AppError && error.message === MISMATCH) return "mismatch";
    throw error;
  }
}

const times = async <T>(n: number, fn: () => Promise<T>): Promise<T[]> => {
  const out: T[] = [];
  for (let i = 0; i < n; i++) out.push(await fn());
  return out;
};

const tally = (results: string[]) =>
  results.reduce<Record<string, number>>((acc, r) => ({ ...acc, [r]: (acc[r] ?? 0) + 1 }), {});

beforeEach(() => setSession(null));
afterAll(async () => {
  const db = getDb();
  if (made.length > 0) await db.delete(users).where(inArray(users.email, made));
  await closeDb();
});

const PER_ACCOUNT = LIMITS.passwordAccountIp.points;
const PER_ADDRESS = LIMITS.passwordIp.points;

describe("password limits", () => {
  test("an attacker's failures do not refuse the owner's correct password", async () => {
    const email = await newAccount();
    const attacker = newAddress();
    const wrong = await times(PER_ACCOUNT + 5, () => signIn(email, "guess-after-guess", attacker));
    expect(tally(wrong)).toEqual({ mismatch: PER_ACCOUNT, limited: 5 });
    // The attacker's address is refused even the right password now...
    expect(await signIn(email, PASSWORD, attacker)).toBe("limited");
    // ...but the owner, from their own address, signs in, and a typo there is a typo, not a refusal.
    const owner = newAddress();
    expect(await signIn(email, "a typo", owner)).toBe("mismatch");
    expect(await signIn(email, PASSWORD, owner)).toBe("ok");
  });

  test("only wrong passwords count: a right one forgives the account's wrong tries from that address", async () => {
    const email = await newAccount();
    const ip = newAddress();
    await times(PER_ACCOUNT - 1, () => signIn(email, "not it", ip));
    expect(await signIn(email, PASSWORD, ip)).toBe("ok");
    // The full budget again.
    expect(tally(await times(PER_ACCOUNT, () => signIn(email, "not it", ip)))).toEqual({ mismatch: PER_ACCOUNT });
    expect(await signIn(email, PASSWORD, ip)).toBe("limited");
  });

  test("wrong passwords sent at the same moment all count", async () => {
    const email = await newAccount();
    const ip = newAddress();
    const results = await Promise.all(Array.from({ length: 2 * PER_ACCOUNT }, () => signIn(email, "burst", ip)));
    expect(tally(results)).toEqual({ mismatch: PER_ACCOUNT, limited: PER_ACCOUNT });
  });

  test("one address guessing across many accounts is stopped, and its own sign-in does not wipe the count", async () => {
    const email = await newAccount();
    const ip = newAddress();
    const spray = (n: number) => times(n, () => signIn(`nobody-${randomUUID()}@example.test`, "spring2024", ip));
    expect(tally(await spray(PER_ADDRESS - 1))).toEqual({ mismatch: PER_ADDRESS - 1 });
    // Signing in to an account of its own gives back that try only.
    expect(await signIn(email, PASSWORD, ip)).toBe("ok");
    expect(tally(await spray(1))).toEqual({ mismatch: 1 });
    expect(tally(await spray(3))).toEqual({ limited: 3 });
    expect(await signIn(email, PASSWORD, ip)).toBe("limited");
    // Another address is not touched.
    expect(await signIn(email, PASSWORD, newAddress())).toBe("ok");
  }, 60_000);

  test("a wrong current password when changing it counts like a wrong sign-in, for that address only", async () => {
    const email = await newAccount();
    const user = await findUserByEmail({ email });
    setSession({ id: user!.id, email, name: "Coach Lornavex" });
    actionAddress = newAddress();
    const change = async (currentPassword: string) => {
      const form = new FormData();
      form.set("currentPassword", currentPassword);
      form.set("newPassword", "another-long-password");
      return changePassword(null, form);
    };
    for (let i = 0; i < PER_ACCOUNT; i++)
      expect(await change("not my password")).toMatchObject({ error: "Your current password is not right." });
    expect(await change(PASSWORD)).toMatchObject({ ok: false, code: "rate_limited" });
    expect(await signIn(email, PASSWORD, actionAddress)).toBe("limited");
    // From another address the account is untouched.
    expect(await signIn(email, PASSWORD, newAddress())).toBe("ok");
  });
});
