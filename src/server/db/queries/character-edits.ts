import "server-only";
import { eq } from "drizzle-orm";
import { applyEdit, dependentsOf, type CharacterEdit, type Dependents } from "@/lib/character-edit";
import { edgeKey, formatProblem, type PortableCharacter, type PortableEdge } from "@/lib/character-file";
import { AppError, VersionConflict, type ErrorIssue } from "@/lib/errors";
import { getDb } from "../index";
import { characters } from "../schema";
import { recordAudit, type AuditAction, type Executor } from "./audit";
import { lockDraft } from "./authoring";
import { gameRangeScale } from "./games";
import {
  collidingKeys,
  compareCharacter,
  fieldChanges,
  loadCharacterRows,
  portableCharacterOf,
  writeCharacter,
  type Rows,
  type Tx,
} from "./character-io";
import type { EditableMove } from "./move-edits";

/**
 * A coach's edits of one character of a draft Edition, one at a time (the Explorer's and the move
 * list's edit controls): each is applied to the whole character in memory (`applyEdit`), checked
 * as an import would be, and the difference written by the import's own writer, in one
 * transaction holding the draft's lock, with its line in the team's log. A change or deletion
 * names the version of the row it was based on; if the row has moved on since, nothing is written
 * and the answer is 409 with the row as it is now.
 */

/** Who edits which character of which Edition (a coach or owner of the game's team, checked by the caller). */
export interface EditScope {
  teamId: number;
  gameId: number;
  editionId: number;
  characterId: number;
  actorId: string;
}

/** A link as the editor reads and saves it: its fields, key and the version they were read at. */
export interface EditableEdge {
  key: string;
  version: number;
  edge: PortableEdge;
}

/** A move with what deleting it would take along (`dependentsOf`). */
export interface MoveWithDependents extends EditableMove {
  dependents: Dependents;
}

type Loaded = { rows: Rows; character: PortableCharacter; target: typeof characters.$inferSelect };

async function load(db: Executor, scope: Omit<EditScope, "teamId" | "actorId">): Promise<Loaded> {
  const [target] = await db.select().from(characters).where(eq(characters.id, scope.characterId));
  if (!target || target.gameId !== scope.gameId) throw new AppError("not_found", "No such character in this game.");
  const rows = await loadCharacterRows(db, scope);
  return { rows, target, character: portableCharacterOf(target, rows) };
}

function editableMove(loaded: Loaded, key: string): EditableMove | null {
  const row = loaded.rows.moveRows.find((m) => m.key === key);
  const move = loaded.character.moves.find((m) => m.key === key);
  return row && move ? { key, version: row.version, move } : null;
}

function editableEdge(loaded: Loaded, key: string): EditableEdge | null {
  const row = loaded.rows.edgeRows.find((e) => e.key === key);
  const edge = loaded.character.edges.find((e) => edgeKey(e) === key);
  return row && edge ? { key, version: row.version, edge } : null;
}

function missing(what: "move" | "edge", key: string): AppError {
  return new AppError(
    "not_found",
    what === "move"
      ? `This character has no move “${key}” in this Edition.`
      : `This character has no link “${key}” in this Edition.`,
  );
}

/** Problems of an edit as a 400: the message lists them, `issues` carries each with its field's path. */
function refused(problems: { message: string; path?: string }[]): AppError {
  const list = problems.slice(0, 5).map(formatProblem).join("; ");
  return new AppError(
    "bad_request",
    `That change would leave the character inconsistent, so nothing was saved: ${list}.`,
    problems.map((p): ErrorIssue => ({ path: p.path ? p.path.split(".") : [], message: p.message })),
  );
}

/** Applies one edit, checks it whole and writes the difference, with the log's line; returns the character after. */
async function commit(
  tx: Tx,
  scope: EditScope,
  loaded: Loaded,
  edit: CharacterEdit,
  audit: { action: AuditAction; detail: Record<string, string | number> },
): Promise<{ loaded: Loaded; touched: { moves: string[]; edges: string[] } }> {
  const result = applyEdit(loaded.character, edit, { range: await gameRangeScale(tx, scope.gameId) });
  if (!result.ok) throw refused(result.problems);
  const next = result.character;
  const colliding = [
    ...(await collidingKeys(
      tx,
      "move",
      next.moves.map((m) => m.key),
    )),
    ...(await collidingKeys(tx, "link", next.edges.map(edgeKey))),
  ];
  if (colliding.length > 0) throw refused(colliding);
  const { preview, reordered } = compareCharacter(loaded.rows, next, loaded.target);
  await writeCharacter(tx, scope, loaded.rows, next, preview, reordered);
  await recordAudit(tx, { teamId: scope.teamId, actorId: scope.actorId, action: audit.action, detail: audit.detail });
  return { loaded: await load(tx, scope), touched: result.touched };
}

function inDraft<T>(scope: EditScope, work: (tx: Tx, loaded: Loaded) => Promise<T>): Promise<T> {
  return getDb().transaction(async (tx) => {
    await lockDraft(tx, scope.gameId, scope.editionId);
    return work(tx, await load(tx, scope));
  });
}

/** A move of any Edition (published ones too) with its version and what deleting it would take along. */
export async function readMove(scope: Omit<EditScope, "teamId" | "actorId">, key: string): Promise<MoveWithDependents> {
  const loaded = await load(getDb(), scope);
  const found = editableMove(loaded, key);
  if (!found) throw missing("move", key);
  return { ...found, dependents: dependentsOf(loaded.character, key) };
}

/** A link of any Edition with its version. */
export async function readEdge(scope: Omit<EditScope, "teamId" | "actorId">, key: string): Promise<EditableEdge> {
  const loaded = await load(getDb(), scope);
  const found = editableEdge(loaded, key);
  if (!found) throw missing("edge", key);
  return found;
}

/** Adds a move, alone or hung off the graph by a new link (`via`): a follow-up, or a move of a stance. */
export function addMove(
  scope: EditScope,
  edit: Extract<CharacterEdit, { op: "add-move" }>,
): Promise<{ move: EditableMove; edge: EditableEdge | null }> {
  return inDraft(scope, async (tx, loaded) => {
    const key = edit.move.key?.trim() || edit.move.input;
    if (loaded.character.moves.some((m) => m.key === key))
      throw new AppError(
        "conflict",
        `This character already has a move with the key “${key}”. Give the new one a key of its own.`,
      );
    const after = await commit(tx, scope, loaded, edit, {
      action: "move.added",
      detail: { move: key, ...(edit.via ? { from: edit.via.from } : {}) },
    });
    const [edge] = after.touched.edges;
    return { move: editableMove(after.loaded, key)!, edge: edge ? editableEdge(after.loaded, edge) : null };
  });
}

/** Adds a link between two nodes the character has: a cancel into a stance, a follow, or an enter. */
export function addEdge(scope: EditScope, edit: Extract<CharacterEdit, { op: "add-edge" }>): Promise<EditableEdge> {
  return inDraft(scope, async (tx, loaded) => {
    const after = await commit(tx, scope, loaded, edit, {
      action: "edge.added",
      detail: { kind: edit.edge.kind, from: edit.edge.from, to: edit.edge.to },
    });
    return editableEdge(after.loaded, after.touched.edges[0]!)!;
  });
}

/** Changes a link's fields, based on the version the editor read. */
export function saveEdge(
  scope: EditScope,
  {
    key,
    version,
    changes,
  }: { key: string; version: number; changes: Extract<CharacterEdit, { op: "change-edge" }>["changes"] },
): Promise<EditableEdge> {
  return inDraft(scope, async (tx, loaded) => {
    const before = editableEdge(loaded, key);
    if (!before) throw missing("edge", key);
    if (before.version !== version)
      throw new VersionConflict(
        "Someone saved this link after you opened it. Compare their values with yours and choose which to keep.",
        before,
      );
    const after = await commit(
      tx,
      scope,
      loaded,
      { op: "change-edge", key, changes },
      {
        action: "edge.changed",
        detail: {
          edge: key,
          fields: fieldChanges(before.edge, { ...before.edge, ...changes })
            .map((c) => c.field)
            .join(", "),
        },
      },
    );
    return editableEdge(after.loaded, after.touched.edges[0] ?? key)!;
  });
}

/** Deletes a move and what goes with it (`dependentsOf`), based on the version the editor read. */
export function deleteMove(scope: EditScope, { key, version }: { key: string; version: number }): Promise<Dependents> {
  return inDraft(scope, async (tx, loaded) => {
    const before = editableMove(loaded, key);
    if (!before) throw missing("move", key);
    if (before.version !== version)
      throw new VersionConflict(
        "Someone saved this move after you opened it. Look at it as it is now before you delete it.",
        { ...before, dependents: dependentsOf(loaded.character, key) },
      );
    const dependents = dependentsOf(loaded.character, key);
    await commit(
      tx,
      scope,
      loaded,
      { op: "delete-move", key },
      {
        action: "move.deleted",
        detail: { move: key, moves_with_it: dependents.moves.length, links_with_it: dependents.edges.length },
      },
    );
    return dependents;
  });
}

/** Deletes one link, based on the version the editor read. */
export function deleteEdge(scope: EditScope, { key, version }: { key: string; version: number }): Promise<void> {
  return inDraft(scope, async (tx, loaded) => {
    const before = editableEdge(loaded, key);
    if (!before) throw missing("edge", key);
    if (before.version !== version)
      throw new VersionConflict(
        "Someone saved this link after you opened it. Look at it as it is now before you delete it.",
        before,
      );
    await commit(tx, scope, loaded, { op: "delete-edge", key }, { action: "edge.deleted", detail: { edge: key } });
  });
}
