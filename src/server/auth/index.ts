import "server-only";
import { getServerSession } from "next-auth";
import { cache } from "react";
import { AppError } from "@/lib/errors";
import { authOptions } from "./options";

export interface SessionUser {
  id: string;
  email: string;
  name: string | null;
}

/**
 * The signed-in user of this request, or null; read once per request. The session callback
 * (session.ts) has already checked the token against the database: an ended session (older
 * session version), a deleted user or an unproven address is null, and the name and e-mail are
 * the database's. Teams and roles are never in the session: they are read per request too.
 */
export const auth: () => Promise<SessionUser | null> = cache(async () => {
  const session = await getServerSession(authOptions());
  const user = session?.user as Partial<SessionUser> | undefined;
  if (!user?.id || !user.email) return null;
  return { id: user.id, email: user.email, name: user.name ?? null };
});

/** The signed-in user, or AppError "unauthorized" for route handlers and actions to answer with. */
export async function requireUser(): Promise<SessionUser> {
  const user = await auth();
  if (!user) throw new AppError("unauthorized", "Sign in to do this.");
  return user;
}
