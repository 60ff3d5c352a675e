import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { decode, type JWT } from "next-auth/jwt";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import { requireRole } from "@/server/authz";
import { closeDb, getDb } from "@/server/db";
import { createTeam, removeMember } from "@/server/db/queries/teams";
import { memberships, users } from "@/server/db/schema";
import { setSession } from "../authz/session-mock";
import { answer, jar } from "./request-mock";

// Item 2 of the account-security issue: every session can be ended. Each token carries the
// session version it was made under, every request compares it with the database, and password
// change, reset and "sign out everywhere" move the version on. Against the test MariaDB.
vi.mock("next/headers", () => import("./request-mock"));
vi.mock("next/server", () => import("./request-mock"));
vi.mock("@/server/auth", () => import("../authz/session-mock"));
vi.mock("@/server/mail/send", () => ({ sendMail: async () => undefined }));

const { changePassword, resetPassword, signOutEverywhere } = await import("@/app/(auth)/actions");
const { authOptions } = await import("@/server/auth/options");
const { claimsFor, sessionCookie } = await import("@/server/auth/session");
const { hashPassword } = await import("@/server/auth/password");
const { createPasswordReset } = await import("@/server/auth/queries");

afterAll(closeDb);
beforeEach(() => {
  jar.clear();
  setSession(null);
});

const PASSWORD = "whiff punish drills";
const db = getDb();

/** A proven password account, and a token for it as a sign-in would make it. */
async function account({ proven = true } = {}) {
  const id = randomUUID();
  const email = `session-${id.slice(0, 8)}@example.test`;
  await getDb()
    .insert(users)
    .values({
      id,
      email,
      name: "Player Marrtesk",
      passwordHash: await hashPassword(PASSWORD),
      emailVerified: proven ? new Date() : null,
    });
  const user = { id, email, name: "Player Marrtesk" };
  return { user, token: claimsFor({ ...user, sessionVersion: 0 }) };
}

/** Who a request carrying `token` is, as every page and route sees it (the session callback). */
async function whoIs(token: JWT): Promise<unknown> {
  const session = await authOptions().callbacks!.session!({
    session: { expires: new Date(Date.now() + 60_000).toISOString() },
    token,
  } as never);
  return (session as { user?: unknown }).user ?? null;
}

/** The token in this browser's session cookie, as next-auth will read it. */
async function cookieToken(): Promise<JWT | null> {
  const value = jar.get(sessionCookie().name);
  return value ? decode({ token: value, secret: process.env.NEXTAUTH_SECRET! }) : null;
}

describe("every request checks its session against the database", () => {
  test("a current token is the user, with the name and e-mail the database has now", async () => {
    const { user, token } = await account();
    expect(await whoIs(token)).toEqual(user);
    await db.update(users).set({ name: "Player Marrvane-Tesk" }).where(eq(users.id, user.id));
    expect(await whoIs({ ...token, name: "stale" })).toEqual({ ...user, name: "Player Marrvane-Tesk" });
  });

  test("a token under an older version, of a deleted user, or of an unproven address is nobody", async () => {
    const { user, token } = await account();
    await db.update(users).set({ sessionVersion: 1 }).where(eq(users.id, user.id));
    expect(await whoIs(token)).toBeNull();
    expect(await whoIs({ ...token, sv: 1 })).toEqual(user);
    await db.delete(users).where(eq(users.id, user.id));
    expect(await whoIs({ ...token, sv: 1 })).toBeNull();
    expect(await whoIs((await account({ proven: false })).token)).toBeNull();
  });

  test("the browser cannot move its own token to a newer version with next-auth's update()", async () => {
    const { token } = await account();
    const updated = await authOptions().callbacks!.jwt!({
      token,
      trigger: "update",
      session: { sv: 7, sub: "someone-else" },
    } as never);
    expect(updated).toEqual(token);
  });

  test("the token carries who and which version, nothing about teams", () => {
    expect(Object.keys(claimsFor({ id: "u", email: "e@example.test", name: null, sessionVersion: 3 })).sort()).toEqual([
      "email",
      "name",
      "sub",
      "sv",
    ]);
  });
});

describe("what ends sessions", () => {
  test("a password change ends every other session; this browser gets a new token from the server", async () => {
    const { user, token } = await account();
    setSession(user);
    expect(
      await answer(changePassword, { currentPassword: PASSWORD, newPassword: "a different long password" }),
    ).toMatchObject({
      ok: true,
    });
    expect(await whoIs(token)).toBeNull();
    const reissued = await cookieToken();
    expect(reissued).toMatchObject({ sub: user.id, sv: 1 });
    expect(await whoIs(reissued!)).toEqual(user);
  });

  test("a password reset ends every session, and proves the address the link was mailed to", async () => {
    const { user, token } = await account({ proven: false });
    let link = "";
    await createPasswordReset({
      email: user.email,
      expiresInMinutes: 30,
      mail: (t) => ((link = t), { subject: "s", text: "t", html: "h" }),
    });
    expect(await answer(resetPassword, { token: link, password: "a brand new password" })).toMatchObject({ ok: true });
    const [row] = await getDb().select().from(users).where(eq(users.id, user.id));
    expect(row?.sessionVersion).toBe(1);
    expect(row?.emailVerified).toBeInstanceOf(Date);
    expect(await whoIs(token)).toBeNull();
  });

  test("sign out everywhere ends every session, this browser's too", async () => {
    const { user, token } = await account();
    jar.set(sessionCookie().name, "this browser's token");
    setSession(user);
    expect(await answer(signOutEverywhere, {})).toEqual({
      redirect: expect.stringContaining("/sign-in?signedOut=everywhere") as unknown,
    });
    expect(await whoIs(token)).toBeNull();
    expect(jar.has(sessionCookie().name)).toBe(false);
  });

  test("a removed member loses the team at once: the role is read from the database on each request", async () => {
    const owner = await account();
    const member = await account();
    const team = await createTeam({ name: "Quick Exit", ownerId: owner.user.id });
    await getDb().insert(memberships).values({ teamId: team.id, userId: member.user.id, role: "coach" });
    expect(await requireRole({ teamId: team.id, userId: member.user.id, needed: "viewer" })).toBe("coach");
    await removeMember({ teamId: team.id, actorId: owner.user.id, userId: member.user.id });
    // The member's session itself is still good; only the team is gone from it.
    expect(await whoIs(member.token)).toEqual(member.user);
    await expect(requireRole({ teamId: team.id, userId: member.user.id, needed: "viewer" })).rejects.toMatchObject({
      code: "not_found",
    });
  });
});
