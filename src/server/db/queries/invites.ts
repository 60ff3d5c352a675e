import "server-only";
import { and, desc, eq, isNull } from "drizzle-orm";
import { AppError } from "@/lib/errors";
import { mayInvite } from "@/lib/roles";
import { atLeast } from "../../authz";
import { queueMail, type OutgoingMail } from "../../mail";
import { hashToken, newToken } from "../../tokens";
import { getDb } from "../index";
import { invites, memberships, teams, users, type Role } from "../schema";
import { recordAudit } from "./audit";
import { lockTeam, memberRole } from "./teams";
import type { InviteDto } from "@/lib/dto";

export const INVITE_DAYS = 7;
const DAY_MS = 86_400_000;

export type InviteLookup =
  | {
      status: "valid";
      teamId: number;
      teamSlug: string;
      teamName: string;
      email: string;
      role: Role;
      inviterName: string | null;
    }
  | { status: "expired" | "used" | "revoked" | "unknown" };

/** What the invite e-mail says, read in the transaction that makes the invite. */
export interface InviteMailFacts {
  token: string;
  email: string;
  role: Role;
  expiresAt: Date;
  teamName: string;
  inviterName: string;
}

/**
 * Creates an invite and returns it with its token. Only the SHA-256 of the token is stored;
 * the token itself goes out in the e-mail and nowhere else. The e-mail made by `mail` is queued
 * in the same transaction (src/server/mail/outbox.ts): the invite and its message are kept or
 * dropped together, and the caller sends it after the commit with `deliverSoon()`.
 *
 * `inviterRole` is the role the caller checked; it is read again under the team's lock, so
 * someone removed or demoted a moment ago sends nothing.
 */
export async function createInvite({
  teamId,
  invitedBy,
  inviterRole,
  email,
  role,
  mail,
  now = new Date(),
}: {
  teamId: number;
  invitedBy: string;
  inviterRole: Role;
  email: string;
  role: Role;
  mail?: (facts: InviteMailFacts) => OutgoingMail;
  now?: Date;
}): Promise<{ invite: InviteDto; token: string }> {
  if (!mayInvite(inviterRole, role))
    throw new AppError("forbidden", `A ${inviterRole} cannot invite someone as ${role}.`);
  const address = email.trim().toLowerCase();
  return getDb().transaction(async (tx) => {
    const team = await lockTeam(tx, teamId);
    const roleNow = await memberRole(tx, teamId, invitedBy);
    if (roleNow === null || !mayInvite(roleNow, role))
      throw new AppError(
        "forbidden",
        roleNow === null
          ? "You are no longer a member of this team, so no invite was sent."
          : `A ${roleNow} cannot invite someone as ${role}.`,
      );
    const [already] = await tx
      .select({ userId: memberships.userId })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.teamId, teamId), eq(users.email, address)))
      .limit(1);
    if (already) throw new AppError("conflict", `${address} is already a member of this team.`);
    const token = newToken();
    const expiresAt = new Date(now.getTime() + INVITE_DAYS * DAY_MS);
    const [row] = await tx
      .insert(invites)
      .values({ teamId, email: address, role, tokenHash: hashToken(token), invitedBy, expiresAt })
      .$returningId();
    await recordAudit(tx, { teamId, actorId: invitedBy, action: "member.invited", detail: { email: address, role } });
    if (mail) {
      const [inviter] = await tx
        .select({ name: users.name, email: users.email })
        .from(users)
        .where(eq(users.id, invitedBy));
      const inviterName = inviter?.name || inviter?.email || "A team member";
      await queueMail(tx, mail({ token, email: address, role, expiresAt, teamName: team.name, inviterName }));
    }
    return {
      token,
      invite: {
        id: row!.id,
        email: address,
        role,
        invitedBy,
        expiresAt: expiresAt.toISOString(),
        createdAt: now.toISOString(),
      },
    };
  });
}

/** Invites still waiting for an answer, newest first. */
export async function listPendingInvites({
  teamId,
  now = new Date(),
}: {
  teamId: number;
  now?: Date;
}): Promise<InviteDto[]> {
  const rows = await getDb()
    .select({
      id: invites.id,
      email: invites.email,
      role: invites.role,
      invitedBy: users.name,
      expiresAt: invites.expiresAt,
      createdAt: invites.createdAt,
    })
    .from(invites)
    .leftJoin(users, eq(users.id, invites.invitedBy))
    .where(and(eq(invites.teamId, teamId), isNull(invites.acceptedAt), isNull(invites.revokedAt)))
    .orderBy(desc(invites.createdAt), desc(invites.id));
  return rows
    .filter((r) => r.expiresAt > now)
    .map((r) => ({ ...r, expiresAt: r.expiresAt.toISOString(), createdAt: r.createdAt.toISOString() }));
}

export async function revokeInvite({
  teamId,
  inviteId,
  actorId,
}: {
  teamId: number;
  inviteId: number;
  actorId: string;
}): Promise<void> {
  await getDb().transaction(async (tx) => {
    await lockTeam(tx, teamId);
    const [row] = await tx
      .select({ email: invites.email, acceptedAt: invites.acceptedAt, revokedAt: invites.revokedAt })
      .from(invites)
      .where(and(eq(invites.id, inviteId), eq(invites.teamId, teamId)))
      .for("update");
    if (!row) throw new AppError("not_found", "No such invite in this team.");
    if (row.acceptedAt) throw new AppError("conflict", "This invite was already accepted.");
    if (row.revokedAt) return;
    await tx.update(invites).set({ revokedAt: new Date() }).where(eq(invites.id, inviteId));
    await recordAudit(tx, { teamId, actorId, action: "invite.revoked", detail: { email: row.email } });
  });
}

/** What an invite link leads to, without using it. */
export async function lookupInvite({ token, now = new Date() }: { token: string; now?: Date }): Promise<InviteLookup> {
  const [row] = await getDb()
    .select({
      teamId: invites.teamId,
      teamSlug: teams.slug,
      teamName: teams.name,
      email: invites.email,
      role: invites.role,
      inviterName: users.name,
      expiresAt: invites.expiresAt,
      acceptedAt: invites.acceptedAt,
      revokedAt: invites.revokedAt,
    })
    .from(invites)
    .innerJoin(teams, eq(teams.id, invites.teamId))
    .leftJoin(users, eq(users.id, invites.invitedBy))
    .where(eq(invites.tokenHash, hashToken(token)))
    .limit(1);
  if (!row) return { status: "unknown" };
  if (row.revokedAt) return { status: "revoked" };
  if (row.acceptedAt) return { status: "used" };
  if (row.expiresAt <= now) return { status: "expired" };
  const { teamId, teamSlug, teamName, email, role, inviterName } = row;
  return { status: "valid", teamId, teamSlug, teamName, email, role, inviterName };
}

export const INVITE_PROBLEM: Record<Exclude<InviteLookup["status"], "valid">, string> = {
  unknown: "This invite link is not valid. Ask the team for a new one.",
  expired: `This invite has expired (invites last ${INVITE_DAYS} days). Ask the team to send a new one.`,
  used: "This invite has already been used.",
  revoked: "This invite was withdrawn by the team.",
};

/**
 * Uses an invite: the signed-in user, whose e-mail must be the invited one, joins the team
 * with the invited role (or keeps a higher role they already have). Single use: the row is
 * locked and marked in the same transaction. Locks are taken in the order every team change
 * uses (the team, then the user, then the invite), so two invites for one person accepted at
 * once run one after the other and both succeed, instead of racing on the membership row.
 */
export async function acceptInvite({
  token,
  userId,
  userEmail,
  now = new Date(),
}: {
  token: string;
  userId: string;
  userEmail: string;
  now?: Date;
}): Promise<{ teamSlug: string; teamName: string; role: Role }> {
  const tokenHash = hashToken(token);
  // The invite's team never changes, so it is read before the transaction that locks the team.
  const [found] = await getDb()
    .select({ teamId: invites.teamId })
    .from(invites)
    .where(eq(invites.tokenHash, tokenHash))
    .limit(1);
  if (!found) throw new AppError("not_found", INVITE_PROBLEM.unknown);
  return getDb().transaction(async (tx) => {
    const team = await lockTeam(tx, found.teamId);
    const [me] = await tx.select({ id: users.id }).from(users).where(eq(users.id, userId)).for("update");
    if (!me) throw new AppError("unauthorized", "Sign in again to accept this invite.");
    const [row] = await tx
      .select({
        id: invites.id,
        teamId: invites.teamId,
        email: invites.email,
        role: invites.role,
        expiresAt: invites.expiresAt,
        acceptedAt: invites.acceptedAt,
        revokedAt: invites.revokedAt,
      })
      .from(invites)
      .where(eq(invites.tokenHash, tokenHash))
      .for("update");
    // An invite sent to someone else answers as one that does not exist, whatever its state:
    // the answer tells a stranger holding a token nothing about the team behind it. (The invite
    // page explains a signed-in person's wrong address before they can press Accept.)
    if (!row || row.email !== userEmail.trim().toLowerCase()) throw new AppError("not_found", INVITE_PROBLEM.unknown);
    const status = row.revokedAt ? "revoked" : row.acceptedAt ? "used" : row.expiresAt <= now ? "expired" : "valid";
    if (status !== "valid") throw new AppError("conflict", INVITE_PROBLEM[status]);
    // Only someone who has proven they own the invited address may take its place in the team.
    const [proven] = await tx.select({ emailVerified: users.emailVerified }).from(users).where(eq(users.id, userId));
    if (!proven?.emailVerified)
      throw new AppError(
        "forbidden",
        "Confirm your e-mail address before joining: open the link we e-mailed you when you created the account.",
      );
    const [member] = await tx
      .select({ role: memberships.role })
      .from(memberships)
      .where(and(eq(memberships.teamId, row.teamId), eq(memberships.userId, userId)))
      .for("update");
    const role = member && atLeast(member.role, row.role) ? member.role : row.role;
    if (member)
      await tx
        .update(memberships)
        .set({ role })
        .where(and(eq(memberships.teamId, row.teamId), eq(memberships.userId, userId)));
    else await tx.insert(memberships).values({ teamId: row.teamId, userId, role });
    await tx.update(invites).set({ acceptedAt: now, acceptedBy: userId }).where(eq(invites.id, row.id));
    await recordAudit(tx, {
      teamId: row.teamId,
      actorId: userId,
      action: "invite.accepted",
      detail: { email: row.email, role },
    });
    return { teamSlug: team.slug, teamName: team.name, role };
  });
}
