import "server-only";
import { decode } from "next-auth/jwt";
import { cookies } from "next/headers";
import { cache } from "react";
import { env } from "@/env";
import { AppError } from "@/lib/errors";
import { sessionCookie, userForToken } from "./session";

export interface SessionUser {
  id: string;
  email: string;
  name: string | null;
}

/**
 * The signed-in user of this request, or null; read once per request. The token is decoded
 * here and checked against the database (session.ts): an ended session (older session
 * version), a deleted user or an unproven address is null, and the name and e-mail are the
 * database's. Teams and roles are never in the session: they are read per request too.
 *
 * This does not go through next-auth's getServerSession: next-auth logs and swallows an error
 * thrown in its session callback and answers "signed out", so a database that stopped answering
 * would look like a missing session (401) instead of the 503 it is.
 */
export const auth: () => Promise<SessionUser | null> = cache(async () => {
  const raw = (await cookies()).get(sessionCookie().name)?.value;
  if (!raw) return null;
  const token = await decode({ token: raw, secret: env().NEXTAUTH_SECRET }).catch(() => null);
  return userForToken(token);
});

/** The signed-in user, or AppError "unauthorized" for route handlers and actions to answer with. */
export async function requireUser(): Promise<SessionUser> {
  const user = await auth();
  if (!user) throw new AppError("unauthorized", "Sign in to do this.");
  return user;
}
