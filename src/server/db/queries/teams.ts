import "server-only";
import { randomBytes } from "node:crypto";
import { and, asc, count, eq } from "drizzle-orm";
import { AppError } from "@/lib/errors";
import { getDb } from "../index";
import { memberships, teams, users, type Role } from "../schema";
import { recordAudit, type Executor } from "./audit";
import type { MemberDto, MyTeamDto, TeamDto } from "@/lib/dto";

/** "Night Shift Crew" → "night-shift-crew-4f1a": readable, and unique without asking the user to pick. */
export function teamSlug(name: string): string {
  const base =
    name
      .normalize("NFKD")
      .replace(/[\u0300-\u036f]/g, "")
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 48) || "team";
  return `${base}-${randomBytes(3).toString("hex")}`;
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

async function ownerCount(tx: Executor, teamId: number): Promise<number> {
  const [row] = await tx
    .select({ n: count() })
    .from(memberships)
    .where(and(eq(memberships.teamId, teamId), eq(memberships.role, "owner")));
  return Number(row?.n ?? 0);
}

async function memberRole(tx: Executor, teamId: number, userId: string): Promise<Role | null> {
  const [row] = await tx
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)))
    .for("update");
  return row?.role ?? null;
}

const LAST_OWNER = "A team needs at least one owner: make someone else an owner first.";

/** An owner changes a member's role. The last owner cannot step down. */
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
    }
    const [member] = (await listMembersWith(tx, teamId)).filter((m) => m.userId === userId);
    return member!;
  });
}

/** An owner removes a member, or a member leaves (actor = the member). The last owner cannot go. */
export async function removeMember({
  teamId,
  actorId,
  userId,
}: {
  teamId: number;
  actorId: string;
  userId: string;
}): Promise<void> {
  await getDb().transaction(async (tx) => {
    const current = await memberRole(tx, teamId, userId);
    if (current === null) throw new AppError("not_found", "That person is not a member of this team.");
    if (current === "owner" && (await ownerCount(tx, teamId)) <= 1) throw new AppError("conflict", LAST_OWNER);
    await tx.delete(memberships).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
    await recordAudit(tx, {
      teamId,
      actorId,
      action: actorId === userId ? "member.left" : "member.removed",
      detail: { userId, role: current },
    });
  });
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
