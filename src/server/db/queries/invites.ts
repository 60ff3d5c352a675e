import "server-only";
import { and, desc, eq, isNull } from "drizzle-orm";
import { AppError } from "@/lib/errors";
import { atLeast } from "../../authz";
import { hashToken, newToken } from "../../tokens";
import { getDb } from "../index";
import { invites, memberships, teams, users, type Role } from "../schema";
import { recordAudit } from "./audit";
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

/** Who may invite whom: owners any role; coaches up to coach (a coach cannot make an owner). */
export function mayInvite(inviter: Role, role: Role): boolean {
  if (inviter === "owner") return true;
  if (inviter === "coach") return role !== "owner";
  return false;
}

/**
 * Creates an invite and returns it with its token. Only the SHA-256 of the token is stored;
 * the token itself goes out in the e-mail and nowhere else. `deliver` sends that e-mail
 * inside the transaction: when it fails, no invite is left behind.
 */
export async function createInvite({
  teamId,
  invitedBy,
  inviterRole,
  email,
  role,
  deliver,
  now = new Date(),
}: {
  teamId: number;
  invitedBy: string;
  inviterRole: Role;
  email: string;
  role: Role;
  deliver?: (message: { token: string; email: string; expiresAt: Date }) => Promise<void>;
  now?: Date;
}): Promise<{ invite: InviteDto; token: string }> {
  if (!mayInvite(inviterRole, role))
    throw new AppError("forbidden", `A ${inviterRole} cannot invite someone as ${role}.`);
  const address = email.trim().toLowerCase();
  return getDb().transaction(async (tx) => {
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
    await deliver?.({ token, email: address, expiresAt });
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
 * locked and marked in the same transaction.
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
  return getDb().transaction(async (tx) => {
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
      .where(eq(invites.tokenHash, hashToken(token)))
      .for("update");
    const status = !row
      ? "unknown"
      : row.revokedAt
        ? "revoked"
        : row.acceptedAt
          ? "used"
          : row.expiresAt <= now
            ? "expired"
            : "valid";
    if (!row || status !== "valid")
      throw new AppError(
        status === "unknown" ? "not_found" : "conflict",
        INVITE_PROBLEM[status as Exclude<typeof status, "valid">],
      );
    if (row.email !== userEmail.trim().toLowerCase()) {
      // The address is not repeated here: an answer to an API call names nobody.
      throw new AppError(
        "forbidden",
        "This invite was sent to another e-mail address. Sign in with the address it was sent to, then accept it.",
      );
    }
    // Only someone who has proven they own the invited address may take its place in the team.
    const [me] = await tx.select({ emailVerified: users.emailVerified }).from(users).where(eq(users.id, userId));
    if (!me?.emailVerified)
      throw new AppError(
        "forbidden",
        "Confirm your e-mail address before joining: open the link we e-mailed you when you created the account.",
      );
    const [team] = await tx.select({ slug: teams.slug, name: teams.name }).from(teams).where(eq(teams.id, row.teamId));
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
    return { teamSlug: team!.slug, teamName: team!.name, role };
  });
}
