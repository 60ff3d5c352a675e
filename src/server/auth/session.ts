import "server-only";
import type { JWT } from "next-auth/jwt";
import { encode } from "next-auth/jwt";
import { cookies } from "next/headers";
import { env } from "@/env";
import type { SessionUser } from "./index";
import { findUserById } from "./queries";

/**
 * Sessions are next-auth JWTs in a cookie, renewed on use for 30 days. A token alone cannot be
 * taken back, so each one carries the user's session version (`sv`) from when it was made, and
 * every request compares it with `users.session_version`: a password change or reset, "sign out
 * everywhere" and a link sign-in that voids an unproven password move the version on, and every
 * older token stops working at its next request. The name and e-mail shown come from the
 * database too, never from the token.
 */
export const SESSION_MAX_AGE = 30 * 24 * 60 * 60;

/**
 * The session cookie, as next-auth names it (`__Secure-` on https) and as it is given to
 * next-auth in `authOptions().cookies`, so a session started here is the one next-auth reads.
 */
export function sessionCookie() {
  const secure = env().NEXTAUTH_URL.startsWith("https://");
  return {
    name: `${secure ? "__Secure-" : ""}next-auth.session-token`,
    options: { httpOnly: true, sameSite: "lax" as const, path: "/", secure },
  };
}

/** What a session token carries: who, and under which session version it was made. */
export function claimsFor(user: { id: string; email: string; name: string | null; sessionVersion: number }): JWT {
  return { sub: user.id, email: user.email, name: user.name, sv: user.sessionVersion };
}

/**
 * The user a token stands for, read from the database on every request; null when the user is
 * gone, the token was made under an older session version, or the address was never proven (no
 * session is ever made for an unproven address; one from before that rule ends here).
 * Tokens made before versions existed carry none and count as version 0.
 */
export async function userForToken(token: JWT | null | undefined): Promise<SessionUser | null> {
  if (typeof token?.sub !== "string") return null;
  const row = await findUserById({ id: token.sub });
  if (!row?.emailVerified) return null;
  const version = typeof token.sv === "number" ? token.sv : 0;
  if (row.sessionVersion !== version) return null;
  return { id: row.id, email: row.email, name: row.name };
}

/**
 * Starts a session in this browser from the server (a server action): used where the server has
 * just proven who the visitor is (a confirmation link) or moved their version on (a password
 * change), so the browser is never trusted to ask for a newer version itself.
 */
export async function startSession(user: Parameters<typeof claimsFor>[0]): Promise<void> {
  const { name, options } = sessionCookie();
  const value = await encode({ token: claimsFor(user), secret: env().NEXTAUTH_SECRET, maxAge: SESSION_MAX_AGE });
  (await cookies()).set(name, value, { ...options, maxAge: SESSION_MAX_AGE });
}

/** Forgets the session cookie of this browser. */
export async function endSessionHere(): Promise<void> {
  const { name, options } = sessionCookie();
  (await cookies()).delete({ name, path: options.path, secure: options.secure, httpOnly: true, sameSite: "lax" });
}
