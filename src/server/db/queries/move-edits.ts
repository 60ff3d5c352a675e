import "server-only";
import { and, eq, sql } from "drizzle-orm";
import { portableMoveSchema, type PortableMove } from "@/lib/character-file";
import { rangeProblem } from "@/lib/engine";
import { AppError, VersionConflict } from "@/lib/errors";
import { getDb } from "../index";
import { moves, stances } from "../schema";
import { lockDraft } from "./authoring";
import { gameRangeScale } from "./games";
import { recordAudit } from "./audit";
import { fieldChanges, portableRows } from "./character-io";

/** What a coach may change on a move in one save: any of its fields but its key and stance. */
export const moveChangesSchema = portableMoveSchema.in.omit({ key: true, stance: true }).partial().strict();
export type MoveChanges = Parameters<typeof moveChangesSchema.parse>[0];

/** A move as the editor reads and saves it: its fields and the version they were read at. */
export interface EditableMove {
  key: string;
  version: number;
  move: PortableMove;
}

/**
 * Saves changes to one move of a draft Edition, based on the version the editor read. A save
 * based on an older version changes nothing and answers 409 with the move as it is now
 * (`VersionConflict`), so no one's save is lost without them seeing it. The log records which
 * fields changed, in the same transaction.
 */
export async function saveMove({
  teamId,
  gameId,
  editionId,
  characterId,
  key,
  version,
  changes,
  actorId,
}: {
  teamId: number;
  gameId: number;
  editionId: number;
  characterId: number;
  key: string;
  version: number;
  changes: MoveChanges;
  actorId: string;
}): Promise<EditableMove> {
  const parsed = moveChangesSchema.parse(changes);
  return getDb().transaction(async (tx) => {
    await lockDraft(tx, gameId, editionId);
    const where = and(eq(moves.editionId, editionId), eq(moves.characterId, characterId), eq(moves.key, key));
    const [row] = await tx.select().from(moves).where(where).for("update");
    if (!row) throw new AppError("not_found", `This character has no move “${key}” in this Edition.`);
    const before = await editable(tx, row);
    if (row.version !== version)
      throw new VersionConflict(
        "Someone saved this move after you opened it. Compare their values with yours and choose which to keep.",
        before,
      );
    const range = rangeProblem(parsed.range, await gameRangeScale(tx, gameId));
    if (range !== null) {
      throw new AppError("bad_request", `Nothing was saved: ${range}.`, [{ path: ["range"], message: range }]);
    }
    const changed = fieldChanges(before.move, { ...before.move, ...parsed });
    if (changed.length === 0) return before;
    await tx
      .update(moves)
      .set({ ...parsed, version: sql`${moves.version} + 1` })
      .where(where);
    await recordAudit(tx, {
      teamId,
      actorId,
      action: "move.changed",
      detail: { move: key, fields: changed.map((c) => c.field).join(", ") },
    });
    const [saved] = await tx.select().from(moves).where(where);
    return editable(tx, saved!);
  });
}

/** A move row as the editor sees it: its fields as a file carries them (the one mapping, portableRows), and its version. */
async function editable(tx: Parameters<typeof lockDraft>[0], row: typeof moves.$inferSelect): Promise<EditableMove> {
  const stanceRows = row.stanceId === null ? [] : await tx.select().from(stances).where(eq(stances.id, row.stanceId));
  const [move] = portableRows({ stanceRows, moveRows: [row], edgeRows: [] }).moves;
  return { key: row.key, version: row.version, move: move!.item };
}
