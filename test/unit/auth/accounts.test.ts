import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { decode } from "next-auth/jwt";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import { MISMATCH, UNCONFIRMED } from "@/lib/auth-messages";
import { closeDb, getDb } from "@/server/db";
import { emailConfirmations, mailOutbox, users } from "@/server/db/schema";
import { setSession } from "../authz/session-mock";
import { makeUser } from "../teams/fixtures";
import { answer, jar, runAfterAnswer } from "./request-mock";

// Item 1 of the account-security issue: no one gets in through an address they never proved.
// Against the test MariaDB; the request (client address, cookies, `after`) and the session are
// stand-ins, and mail is read from the outbox.
vi.mock("next/headers", () => import("./request-mock"));
vi.mock("next/server", () => import("./request-mock"));
vi.mock("@/server/auth", () => import("../authz/session-mock"));
vi.mock("@/server/mail/send", () => ({ sendMail: async () => undefined }));
vi.mock("@/server/auth/password", async (original) => {
  const real = await original<typeof import("@/server/auth/password")>();
  return { ...real, hashPassword: vi.fn(real.hashPassword) };
});

const { hashPassword } = await import("@/server/auth/password");
const { confirmEmail, resendConfirmation, signUp } = await import("@/app/(auth)/actions");
const { authorizePassword, authOptions } = await import("@/server/auth/options");
const { claimsFor, sessionCookie, userForToken } = await import("@/server/auth/session");
const { confirmationState } = await import("@/server/auth/queries");

afterAll(closeDb);
beforeEach(async () => {
  await runAfterAnswer();
  jar.clear();
  setSession(null);
  vi.mocked(hashPassword).mockClear();
});

const PASSWORD = "practice the stance loops";
const newEmail = (tag: string) => `${tag}-${randomUUID().slice(0, 8)}@example.test`;
const someIp = () => ({ "x-forwarded-for": `198.51.100.${Math.floor(Math.random() * 250) + 1}` });

async function outboxTo(address: string) {
  return getDb().select().from(mailOutbox).where(eq(mailOutbox.to, address));
}

/** An account made through the sign-up form, its mail still unread. */
async function signUpAs(email: string, password = PASSWORD, name = "Coach Hollowvane") {
  await answer(signUp, { name, email, password });
  await runAfterAnswer();
  const [user] = await getDb().select().from(users).where(eq(users.email, email));
  return user!;
}

/** The link in the latest confirmation mail to `email`. */
async function confirmationLink(email: string): Promise<URL> {
  const mails = (await outboxTo(email)).filter((m) => m.subject.startsWith("Confirm"));
  const url = /https?:\/\/\S+/.exec(mails.at(-1)?.text ?? "")?.[0];
  if (!url) throw new Error(`no confirmation mail to ${email}`);
  return new URL(url);
}

describe("an account works only once its address is proven", () => {
  test("sign-up leaves the address unproven and mails a single-use confirmation link, stored only as its SHA-256", async () => {
    const email = newEmail("fresh");
    const user = await signUpAs(email);
    expect(user.emailVerified).toBeNull();
    expect(user.passwordHash).toMatch(/^\$argon2id\$/);
    const link = await confirmationLink(email);
    expect(link.pathname).toBe("/confirm-email");
    const token = link.searchParams.get("token")!;
    const rows = await getDb().select().from(emailConfirmations).where(eq(emailConfirmations.userId, user.id));
    expect(rows.map((r) => r.tokenHash)).not.toContain(token);
    expect(rows).toHaveLength(1);
    expect(await confirmationState({ token })).toBe("valid");
  });

  test("the right password on an unproven account is refused with the way forward; a wrong one gets the usual mismatch", async () => {
    const email = newEmail("unproven");
    await signUpAs(email);
    await expect(authorizePassword({ email, password: PASSWORD }, someIp())).rejects.toMatchObject({
      code: "forbidden",
      message: UNCONFIRMED,
    });
    await expect(authorizePassword({ email, password: "not the password at all" }, someIp())).rejects.toMatchObject({
      code: "unauthorized",
      message: MISMATCH,
    });
  });

  test("the confirmation link proves the address, signs in whoever opened it, and works once", async () => {
    const email = newEmail("confirms");
    const user = await signUpAs(email);
    const token = (await confirmationLink(email)).searchParams.get("token")!;

    expect(await answer(confirmEmail, { token, callbackUrl: "/teams" })).toEqual({
      redirect: expect.stringContaining("/confirm-email?confirmed=1&callbackUrl=%2Fteams") as unknown,
    });
    const [after] = await getDb().select().from(users).where(eq(users.id, user.id));
    expect(after?.emailVerified).toBeInstanceOf(Date);
    // The session cookie next-auth reads, for this user, under the current session version.
    const cookie = jar.get(sessionCookie().name);
    const claims = await decode({ token: cookie!, secret: process.env.NEXTAUTH_SECRET! });
    expect(claims).toMatchObject({ sub: user.id, sv: after!.sessionVersion });
    expect(await userForToken(claims)).toEqual({ id: user.id, email, name: "Coach Hollowvane" });

    expect(await authorizePassword({ email, password: PASSWORD }, someIp())).toMatchObject({ id: user.id });
    expect(await answer(confirmEmail, { token })).toMatchObject({ ok: false, code: "conflict" });
    expect(await answer(confirmEmail, { token: "no-such-token" })).toMatchObject({ ok: false, code: "not_found" });
  });

  test("a new confirmation link is sent only to an account waiting for one, and the answer is the same for every address", async () => {
    const waiting = newEmail("waiting");
    await signUpAs(waiting);
    const proven = (await makeUser("proven")).email;
    const nobody = newEmail("nobody");
    const answers = [];
    for (const email of [waiting, proven, nobody]) answers.push(await answer(resendConfirmation, { email }));
    expect(new Set(answers.map((a) => JSON.stringify(a))).size).toBe(1);
    await runAfterAnswer();
    expect((await outboxTo(waiting)).filter((m) => m.subject.startsWith("Confirm"))).toHaveLength(2);
    expect(await outboxTo(proven)).toHaveLength(0);
    expect(await outboxTo(nobody)).toHaveLength(0);
  });
});

describe("a sign-in by e-mailed link into an unproven account", () => {
  /**
   * What next-auth 4 does when a sign-in link is opened (core/routes/callback.js): signIn with
   * the account as it was (address still unproven), then the adapter marks the address proven,
   * then jwt with that fresh row makes the new session's token.
   */
  async function openSignInLink(email: string) {
    const options = authOptions();
    const [before] = await getDb().select().from(users).where(eq(users.email, email));
    const account = { type: "email" as const, provider: "email", providerAccountId: email };
    expect(await options.callbacks!.signIn!({ user: before!, account })).toBe(true);
    const fresh = await options.adapter!.updateUser!({ id: before!.id, emailVerified: new Date() });
    return options.callbacks!.jwt!({ token: { sub: fresh.id }, user: fresh, account, trigger: "signIn" });
  }

  test("voids the password someone else chose, ends every session made with it, and stops its confirmation links", async () => {
    const victim = newEmail("coach");
    // Someone who does not own the address signs up with it, and holds a session made back
    // when sign-up still signed people in (a token under the version of that time).
    const squatted = await signUpAs(victim, "the squatter's password", "Not The Coach");
    const squatterToken = claimsFor(squatted);
    const pendingLink = (await confirmationLink(victim)).searchParams.get("token")!;

    const ownerToken = await openSignInLink(victim);

    const [row] = await getDb().select().from(users).where(eq(users.id, squatted.id));
    expect(row?.passwordHash).toBeNull();
    expect(row?.sessionVersion).toBe(squatted.sessionVersion + 1);
    expect(row?.emailVerified).toBeInstanceOf(Date);
    await expect(
      authorizePassword({ email: victim, password: "the squatter's password" }, someIp()),
    ).rejects.toMatchObject({
      message: MISMATCH,
    });
    expect(await userForToken(squatterToken)).toBeNull();
    expect(await confirmationState({ token: pendingLink })).toBe("used");
    expect(await userForToken(ownerToken)).toMatchObject({ id: squatted.id, email: victim });
  });

  test("leaves a proven account's password and sessions alone", async () => {
    const email = newEmail("settled");
    const user = await signUpAs(email);
    await answer(confirmEmail, { token: (await confirmationLink(email)).searchParams.get("token")! });
    const [proven] = await getDb().select().from(users).where(eq(users.id, user.id));
    await openSignInLink(email);
    const [row] = await getDb().select().from(users).where(eq(users.id, user.id));
    expect(row?.passwordHash).toBe(proven!.passwordHash);
    expect(await userForToken(claimsFor(proven!))).not.toBeNull();
  });
});
