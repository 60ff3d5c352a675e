import "server-only";
import { randomBytes } from "node:crypto";
import { and, asc, count, eq, gt, inArray, isNull } from "drizzle-orm";
import { slugify } from "@/lib/authoring";
import { AppError } from "@/lib/errors";
import { mayInvite } from "@/lib/roles";
import { getDb } from "../index";
import { invites, memberships, teams, users, type Role } from "../schema";
import { recordAudit, type Executor } from "./audit";
import type { MemberDto, MyTeamDto, TeamDto } from "@/lib/dto";

/** "Night Shift Crew" → "night-shift-crew-4f1a": readable, and unique without asking the user to pick. */
export function teamSlug(name: string): string {
  return `${slugify(name, "team")}-${randomBytes(3).toString("hex")}`;
}

/** Creates a team with its creator as the first owner, in one transaction. */
export async function createTeam({ name, ownerId }: { name: string; ownerId: string }): Promise<MyTeamDto> {
  return getDb().transaction(async (tx) => {
    const slug = teamSlug(name);
    const [created] = await tx.insert(teams).values({ slug, name }).$returningId();
    const id = created!.id;
    await tx.insert(memberships).values({ teamId: id, userId: ownerId, role: "owner" });
    await recordAudit(tx, { teamId: id, actorId: ownerId, action: "team.created", detail: { name } });
    return { id, slug, name, role: "owner" };
  });
}

/** The teams a user belongs to, with their role in each, by name. */
export async function listMyTeams({ userId }: { userId: string }): Promise<MyTeamDto[]> {
  return getDb()
    .select({ id: teams.id, slug: teams.slug, name: teams.name, role: memberships.role })
    .from(memberships)
    .innerJoin(teams, eq(teams.id, memberships.teamId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(teams.name), asc(teams.id));
}

export async function getTeamBySlug({ slug }: { slug: string }): Promise<TeamDto | null> {
  const [row] = await getDb()
    .select({ id: teams.id, slug: teams.slug, name: teams.name })
    .from(teams)
    .where(eq(teams.slug, slug))
    .limit(1);
  return row ?? null;
}

export async function listMembers({ teamId }: { teamId: number }): Promise<MemberDto[]> {
  return listMembersWith(getDb(), teamId);
}

/**
 * Locks the team's row for the rest of the transaction and returns it. Every change to a team's
 * members or invites takes this lock first, so such changes run one after another: two owners
 * demoting each other at once cannot both see two owners. The team comes first in the lock
 * order (then the user, then invites and memberships), so these changes cannot deadlock.
 */
export async function lockTeam(tx: Executor, teamId: number): Promise<TeamDto> {
  const [team] = await tx
    .select({ id: teams.id, slug: teams.slug, name: teams.name })
    .from(teams)
    .where(eq(teams.id, teamId))
    .for("update");
  if (!team) throw new AppError("not_found", "No such team.");
  return team;
}

/** Owners as committed now: a locking read, so it never answers from an older snapshot. */
async function ownerCount(tx: Executor, teamId: number): Promise<number> {
  const [row] = await tx
    .select({ n: count() })
    .from(memberships)
    .where(and(eq(memberships.teamId, teamId), eq(memberships.role, "owner")))
    .for("update");
  return Number(row?.n ?? 0);
}

/** A member's role, read with a lock on their membership row (null for a non-member). */
export async function memberRole(tx: Executor, teamId: number, userId: string): Promise<Role | null> {
  const [row] = await tx
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)))
    .for("update");
  return row?.role ?? null;
}

const LAST_OWNER = "A team needs at least one owner: make someone else an owner first.";

/**
 * The route checked the actor's role before the transaction; another owner may have changed it
 * since. Read again under the team lock, so a change is only made by someone who is an owner
 * when it is made.
 */
async function requireOwnerNow(tx: Executor, teamId: number, actorId: string): Promise<void> {
  if ((await memberRole(tx, teamId, actorId)) !== "owner")
    throw new AppError("forbidden", "You are no longer an owner of this team, so this change was not made.");
}

/**
 * An owner changes a member's role. The last owner cannot step down. Waiting invites the member
 * sent that the new role could not send are withdrawn.
 */
export async function changeRole({
  teamId,
  actorId,
  userId,
  role,
}: {
  teamId: number;
  actorId: string;
  userId: string;
  role: Role;
}): Promise<MemberDto> {
  return getDb().transaction(async (tx) => {
    await lockTeam(tx, teamId);
    await requireOwnerNow(tx, teamId, actorId);
    const current = await memberRole(tx, teamId, userId);
    if (current === null) throw new AppError("not_found", "That person is not a member of this team.");
    if (current === "owner" && role !== "owner" && (await ownerCount(tx, teamId)) <= 1)
      throw new AppError("conflict", LAST_OWNER);
    if (current !== role) {
      await tx
        .update(memberships)
        .set({ role })
        .where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
      await recordAudit(tx, {
        teamId,
        actorId,
        action: "member.role_changed",
        detail: { userId, from: current, to: role },
      });
      // Invites they sent that their new role could not send are withdrawn (a demoted coach's all,
      // a demoted owner's invites to be an owner).
      await withdrawInvitesSentBy(tx, {
        teamId,
        actorId,
        invitedBy: userId,
        reason: "sender_demoted",
        now: new Date(),
        keep: role,
      });
    }
    const [member] = (await listMembersWith(tx, teamId)).filter((m) => m.userId === userId);
    return member!;
  });
}

/**
 * An owner removes a member, or a member leaves (actor = the member). The last owner cannot go.
 * The invites they sent that are still waiting are withdrawn with them: nobody joins on the word
 * of someone who is no longer in the team.
 */
export async function removeMember({
  teamId,
  actorId,
  userId,
  now = new Date(),
}: {
  teamId: number;
  actorId: string;
  userId: string;
  now?: Date;
}): Promise<void> {
  await getDb().transaction(async (tx) => {
    await lockTeam(tx, teamId);
    const leaving = actorId === userId;
    if (!leaving) await requireOwnerNow(tx, teamId, actorId);
    const current = await memberRole(tx, teamId, userId);
    if (current === null) throw new AppError("not_found", "That person is not a member of this team.");
    if (current === "owner" && (await ownerCount(tx, teamId)) <= 1) throw new AppError("conflict", LAST_OWNER);
    await tx.delete(memberships).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
    await recordAudit(tx, {
      teamId,
      actorId,
      action: leaving ? "member.left" : "member.removed",
      detail: { userId, role: current },
    });
    await withdrawInvitesSentBy(tx, {
      teamId,
      actorId,
      invitedBy: userId,
      reason: leaving ? "sender_left" : "sender_removed",
      now,
    });
  });
}

/**
 * Withdraws the invites a member sent that are still waiting, one log entry each; with `keep`
 * (their new role), only those that role may not send.
 */
async function withdrawInvitesSentBy(
  tx: Executor,
  {
    teamId,
    actorId,
    invitedBy,
    reason,
    now,
    keep = null,
  }: {
    teamId: number;
    actorId: string;
    invitedBy: string;
    reason: "sender_left" | "sender_removed" | "sender_demoted";
    now: Date;
    keep?: Role | null;
  },
): Promise<void> {
  const waiting = and(
    eq(invites.teamId, teamId),
    eq(invites.invitedBy, invitedBy),
    isNull(invites.acceptedAt),
    isNull(invites.revokedAt),
    gt(invites.expiresAt, now),
  );
  const pending = (
    await tx
      .select({ id: invites.id, email: invites.email, role: invites.role })
      .from(invites)
      .where(waiting)
      .for("update")
  ).filter((invite) => !mayInvite(keep, invite.role));
  if (pending.length === 0) return;
  await tx
    .update(invites)
    .set({ revokedAt: now })
    .where(
      inArray(
        invites.id,
        pending.map((i) => i.id),
      ),
    );
  for (const invite of pending)
    await recordAudit(tx, { teamId, actorId, action: "invite.revoked", detail: { email: invite.email, reason } });
}

async function listMembersWith(tx: Executor, teamId: number): Promise<MemberDto[]> {
  const rows = await tx
    .select({
      userId: users.id,
      name: users.name,
      email: users.email,
      role: memberships.role,
      joinedAt: memberships.createdAt,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.teamId, teamId))
    .orderBy(asc(memberships.createdAt), asc(users.email));
  return rows.map((r) => ({ ...r, joinedAt: r.joinedAt.toISOString() }));
}
