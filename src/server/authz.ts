import "server-only";
import { and, eq } from "drizzle-orm";
import { AppError } from "@/lib/errors";
import { getDb } from "./db";
import { atLeast, type Role } from "@/lib/roles";
import { memberships } from "./db/schema";

export { atLeast };

/** The user's role in the team, or null when they are not a member. */
export async function getRole({ teamId, userId }: { teamId: number; userId: string }): Promise<Role | null> {
  const [row] = await getDb()
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)))
    .limit(1);
  return row?.role ?? null;
}

/**
 * The one team check of every route handler and server action, after the
 * session: a non-member gets the same 404 as a team that does not exist (so
 * nothing leaks about other teams); a member whose role is too low gets 403.
 */
export async function requireRole({
  teamId,
  userId,
  needed,
}: {
  teamId: number;
  userId: string;
  needed: Role;
}): Promise<Role> {
  const role = await getRole({ teamId, userId });
  if (role === null) throw new AppError("not_found", "No such team.");
  if (!atLeast(role, needed))
    throw new AppError("forbidden", `This needs the ${needed} role or higher in the team; you are a ${role}.`);
  return role;
}
