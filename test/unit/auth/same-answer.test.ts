import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import type { Pool as PromisePool } from "mysql2/promise";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import { closeDb, getDb } from "@/server/db";
import { mailOutbox, passwordResets, users } from "@/server/db/schema";
import { makeUser } from "../teams/fixtures";
import { answer, runAfterAnswer, waitingAfterAnswer } from "./request-mock";

// Item 7 of the account-security issue: sign-up and password reset must not tell which
// addresses have accounts, by their answer or by its timing. No timed assertion (speed lives in
// the benches): the answers are compared, and the test checks that nothing that depends on the
// account runs before the answer (no statement on the app's pool) and that the same work (the
// password hash) is done for both. `after` is held by request-mock until the test runs it.
vi.mock("next/headers", () => import("./request-mock"));
vi.mock("next/server", () => import("./request-mock"));
vi.mock("@/server/mail/send", () => ({ sendMail: async () => undefined }));
vi.mock("@/server/auth/password", async (original) => {
  const real = await original<typeof import("@/server/auth/password")>();
  return { ...real, hashPassword: vi.fn(real.hashPassword) };
});

const { hashPassword } = await import("@/server/auth/password");
const { requestPasswordReset, signUp } = await import("@/app/(auth)/actions");

afterAll(closeDb);
beforeEach(async () => {
  await runAfterAnswer();
  vi.mocked(hashPassword).mockClear();
});

const PASSWORD = "practice the stance loops";
const newEmail = (tag: string) => `${tag}-${randomUUID().slice(0, 8)}@example.test`;

/**
 * The statements the app's database pool ran while `fn` ran. The rate limits use the pool
 * underneath and are not counted: they depend on the caller, not on the account.
 */
async function statementsDuring<T>(fn: () => Promise<T>): Promise<{ result: T; statements: string[] }> {
  const pool = (getDb() as unknown as { $client: PromisePool }).$client;
  // Spies call through: the statements run as usual and are only noted.
  const spies = [vi.spyOn(pool, "query"), vi.spyOn(pool, "execute"), vi.spyOn(pool, "getConnection")];
  try {
    const result = await fn();
    const statements = spies.flatMap((spy) => spy.mock.calls.map((call) => JSON.stringify(call[0] ?? "a transaction")));
    return { result, statements };
  } finally {
    for (const spy of spies) spy.mockRestore();
  }
}

const outboxTo = (address: string) => getDb().select().from(mailOutbox).where(eq(mailOutbox.to, address));

describe("sign-up and reset say nothing about which addresses have accounts", () => {
  test("sign-up answers a taken address exactly like a new one, and only mails differ", async () => {
    const taken = await makeUser("taken");
    const fresh = newEmail("fresh");
    const [before] = await getDb().select().from(users).where(eq(users.id, taken.id));

    const forTaken = await statementsDuring(() =>
      answer(signUp, { name: "Someone Else", email: taken.email, password: PASSWORD }),
    );
    const forFresh = await statementsDuring(() =>
      answer(signUp, { name: "New Person", email: fresh, password: PASSWORD }),
    );

    expect(forTaken.result).toEqual(forFresh.result);
    expect(forFresh.result).toEqual({ redirect: expect.stringContaining("/check-email?for=confirm") as unknown });
    // Before the answer: the same work for both (the password is hashed either way) and not one
    // statement on the accounts, so neither the answer nor its timing depends on them.
    expect(vi.mocked(hashPassword)).toHaveBeenCalledTimes(2);
    expect(forTaken.statements).toEqual([]);
    expect(forFresh.statements).toEqual([]);
    expect(waitingAfterAnswer()).toBe(2);

    await runAfterAnswer();
    expect((await outboxTo(taken.email)).map((m) => m.subject)).toEqual(["You already have a Framefork account"]);
    expect((await outboxTo(fresh)).map((m) => m.subject)).toEqual(["Confirm your e-mail address for Framefork"]);
    // The existing account is left as it was.
    const [after] = await getDb().select().from(users).where(eq(users.id, taken.id));
    expect(after).toEqual(before);
  });

  test("a reset request answers the same for a known and an unknown address, looking nothing up before the answer", async () => {
    const known = await makeUser("known");
    const unknown = newEmail("unknown");
    const forKnown = await statementsDuring(() => answer(requestPasswordReset, { email: known.email }));
    const forUnknown = await statementsDuring(() => answer(requestPasswordReset, { email: unknown }));
    expect(forKnown.result).toEqual(forUnknown.result);
    expect(forKnown.result).toEqual({ redirect: expect.stringContaining("/check-email?for=reset") as unknown });
    expect(forKnown.statements).toEqual([]);
    expect(forUnknown.statements).toEqual([]);

    // The spies do see the accounts work: it runs after the answer.
    expect((await statementsDuring(runAfterAnswer)).statements.length).toBeGreaterThan(0);
    expect((await outboxTo(known.email)).map((m) => m.subject)).toEqual(["Reset your Framefork password"]);
    const resets = await getDb().select().from(passwordResets).where(eq(passwordResets.userId, known.id));
    expect(resets).toHaveLength(1);
    expect(await outboxTo(unknown)).toHaveLength(0);
  });
});
