import "server-only";
import { asc, eq } from "drizzle-orm";
import { getDb, type Database } from "../index";
import { auditLog, users } from "../schema";
import type { AuditEntryDto } from "@/lib/dto";

/** A transaction handle or the pool: audit entries are written inside the change they record. */
export type Executor = Pick<Database, "insert" | "select" | "update" | "delete">;

export type AuditAction =
  | "team.created"
  | "member.invited"
  | "invite.revoked"
  | "invite.accepted"
  | "member.role_changed"
  | "member.removed"
  | "member.left"
  | "permalink.created"
  | "permalink.revoked"
  | "game.created"
  | "character.created"
  | "stance.created"
  | "character.imported"
  | "edition.started"
  | "edition.published"
  | "move.changed"
  | "move.added"
  | "move.deleted"
  | "edge.added"
  | "edge.changed"
  | "edge.deleted"
  | "board.created"
  | "board.saved"
  | "board.deleted";

/** Records who did what in a team. Call it with the transaction that makes the change. */
export async function recordAudit(
  tx: Executor,
  entry: {
    teamId: number;
    actorId: string | null;
    action: AuditAction;
    detail: Record<string, string | number | boolean | null>;
  },
): Promise<void> {
  await tx.insert(auditLog).values(entry);
}

/** A team's log, oldest first. */
export async function listAudit({ teamId }: { teamId: number }): Promise<AuditEntryDto[]> {
  const rows = await getDb()
    .select({
      id: auditLog.id,
      action: auditLog.action,
      actorName: users.name,
      actorEmail: users.email,
      detail: auditLog.detail,
      createdAt: auditLog.createdAt,
    })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.actorId))
    .where(eq(auditLog.teamId, teamId))
    .orderBy(asc(auditLog.createdAt), asc(auditLog.id));
  return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }));
}
