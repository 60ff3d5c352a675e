import "server-only";
import { and, desc, eq, sql } from "drizzle-orm";
import { alias, type SelectedFields } from "drizzle-orm/mysql-core";
import { boardToSolve, savedBoardDocumentSchema, type BoardDocument, type BoardOrigin } from "@/lib/board";
import { BoardInputError, solveBoard } from "@/lib/engine";
import { AppError, VersionConflict } from "@/lib/errors";
import { parseWith } from "@/server/http";
import { getDb } from "../index";
import { boards, characters, editions, games, teams, users } from "../schema";
import { recordAudit, type Executor } from "./audit";
import { characterForTeam, gameEdition, opponentInGame } from "./games";
import type { BoardDto, BoardSummaryDto } from "@/lib/dto";

// A team's Mix-up boards. Every read is scoped to the team: another team's board answers
// exactly like a board that does not exist. Every change is based on the version the editor
// read and writes the team's log in the same transaction.

const opponents = alias(characters, "opponent");
const updaters = alias(users, "updater");

const summaryColumns = {
  id: boards.id,
  title: boards.title,
  version: boards.version,
  game: { slug: games.slug, name: games.name },
  character: { id: characters.id, slug: characters.slug, name: characters.name },
  edition: { slug: editions.slug, name: editions.name, status: editions.status },
  opponentId: opponents.id,
  opponentSlug: opponents.slug,
  opponentName: opponents.name,
  updatedAt: boards.updatedAt,
  updatedById: boards.updatedBy,
  updatedByName: updaters.name,
};

/** Boards with the names their DTO shows: game, character, Edition, opponent, who saved last. */
function selectBoards<C extends SelectedFields>(db: Executor, extra: C) {
  return db
    .select({ ...summaryColumns, ...extra })
    .from(boards)
    .innerJoin(characters, eq(characters.id, boards.characterId))
    .innerJoin(games, eq(games.id, characters.gameId))
    .innerJoin(editions, eq(editions.id, boards.editionId))
    .leftJoin(opponents, eq(opponents.id, boards.opponentId))
    .leftJoin(updaters, eq(updaters.id, boards.updatedBy));
}

type SummaryRow = Awaited<ReturnType<typeof selectBoards<{}>>>[number];

function toSummary(row: SummaryRow): BoardSummaryDto {
  return {
    id: row.id,
    title: row.title,
    version: row.version,
    game: row.game,
    character: row.character,
    edition: row.edition,
    opponent: row.opponentId === null ? null : { id: row.opponentId, slug: row.opponentSlug!, name: row.opponentName! },
    updatedAt: row.updatedAt.toISOString(),
    updatedBy: row.updatedById === null ? null : { id: row.updatedById, name: row.updatedByName },
  };
}

const fullColumns = {
  team: { slug: teams.slug, name: teams.name },
  origin: boards.origin,
  document: boards.document,
  editionId: boards.editionId,
  characterId: boards.characterId,
};

/** A board with what a permalink pins: its Edition's and character's ids. */
export type BoardWithPins = BoardDto & { editionId: number; characterId: number };

/** One board of the team, as its editor opens it; null for an unknown id or another team's board. */
async function findBoard(
  db: Executor,
  { teamId, boardId }: { teamId: number; boardId: number },
): Promise<BoardWithPins | null> {
  const [row] = await selectBoards(db, fullColumns)
    .innerJoin(teams, eq(teams.id, boards.teamId))
    .where(and(eq(boards.id, boardId), eq(boards.teamId, teamId)))
    .limit(1);
  if (!row) return null;
  return {
    ...toSummary(row),
    team: row.team,
    origin: row.origin ?? null,
    document: row.document,
    editionId: row.editionId,
    characterId: row.characterId,
  };
}

const noSuchBoard = () => new AppError("not_found", "No such board in this team.");

/** Strips what only the server needs (the pinned ids) from a board. */
const dto = ({ editionId: _e, characterId: _c, ...board }: BoardWithPins): BoardDto => board;

/**
 * A document as it may be saved: its shape and its references (`savedBoardDocumentSchema`),
 * 400 with every issue otherwise.
 */
function checkedDocument(document: BoardDocument): BoardDocument {
  const checked = parseWith(savedBoardDocumentSchema, document, "body");
  // A board that cannot be solved (a cycle of situations, found by the engine) is never saved.
  try {
    solveBoard(boardToSolve(checked));
  } catch (error) {
    if (error instanceof BoardInputError) throw new AppError("bad_request", error.message);
    throw error;
  }
  return checked;
}

/** A team's boards, the last saved first. */
export async function listBoards({ teamId }: { teamId: number }): Promise<BoardSummaryDto[]> {
  const rows = await selectBoards(getDb(), {})
    .where(eq(boards.teamId, teamId))
    .orderBy(desc(boards.updatedAt), desc(boards.id));
  return rows.map(toSummary);
}

/** One board of the team; an unknown id and another team's board both answer 404. */
export async function getBoard({ teamId, boardId }: { teamId: number; boardId: number }): Promise<BoardDto> {
  const board = await findBoard(getDb(), { teamId, boardId });
  if (!board) throw noSuchBoard();
  return dto(board);
}

/** One board of the team with the ids a permalink pins, or null: for `permalinks.ts`. */
export function readBoardForLink({ teamId, boardId }: { teamId: number; boardId: number }) {
  return findBoard(getDb(), { teamId, boardId });
}

/**
 * Makes a board for a character in an Edition (draft or published) of a game the team may
 * read: the public demo game or its own. Another team's character answers like one that does
 * not exist; the opponent, if any, must be of the same game. The board and its log entry are
 * written together; the caller has checked the role (coach or higher).
 */
export async function createBoard({
  teamId,
  actorId,
  characterId,
  editionSlug,
  opponentId,
  title,
  origin,
  document,
}: {
  teamId: number;
  actorId: string;
  characterId: number;
  editionSlug: string;
  opponentId: number | null;
  title: string;
  origin: BoardOrigin | null;
  document: BoardDocument;
}): Promise<BoardDto> {
  const { game } = await characterForTeam({ teamId, characterId });
  const edition = await gameEdition({ game, slug: editionSlug });
  if (opponentId !== null) await opponentInGame({ opponentId, game });
  const checked = checkedDocument(document);
  return getDb().transaction(async (tx) => {
    const [made] = await tx
      .insert(boards)
      .values({
        teamId,
        editionId: edition.id,
        characterId,
        opponentId,
        title,
        origin,
        document: checked,
        createdBy: actorId,
        updatedBy: actorId,
      })
      .$returningId();
    const board = await findBoard(tx, { teamId, boardId: made!.id });
    if (!board) throw new Error(`board ${made!.id} vanished after its insert`);
    await recordAudit(tx, {
      teamId,
      actorId,
      action: "board.created",
      detail: { board: board.id, title: board.title, version: board.version },
    });
    return dto(board);
  });
}

/** The board, locked for a change, checked against the version the editor read. */
async function lockedAtVersion(
  tx: Executor,
  { teamId, boardId, version, conflict }: { teamId: number; boardId: number; version: number; conflict: string },
): Promise<BoardWithPins> {
  // Only the board's row is locked: its joins (the Edition, the character) stay free for others.
  await tx
    .select({ id: boards.id })
    .from(boards)
    .where(and(eq(boards.id, boardId), eq(boards.teamId, teamId)))
    .for("update");
  const board = await findBoard(tx, { teamId, boardId });
  if (!board) throw noSuchBoard();
  if (board.version !== version) throw new VersionConflict(conflict, dto(board));
  return board;
}

/**
 * Saves a board's title and document, based on the version the editor read: a save based on an
 * older one changes nothing and answers 409 with the board as it is now (`VersionConflict`).
 * The saved board has the next version.
 */
export async function saveBoard({
  teamId,
  boardId,
  actorId,
  version,
  title,
  document,
}: {
  teamId: number;
  boardId: number;
  actorId: string;
  version: number;
  title: string;
  document: BoardDocument;
}): Promise<BoardDto> {
  const checked = checkedDocument(document);
  return getDb().transaction(async (tx) => {
    await lockedAtVersion(tx, {
      teamId,
      boardId,
      version,
      conflict:
        "Someone saved this board after you opened it. Compare their board with yours and choose which to keep.",
    });
    await tx
      .update(boards)
      .set({
        title,
        document: checked,
        version: sql`${boards.version} + 1`,
        updatedBy: actorId,
        updatedAt: sql`CURRENT_TIMESTAMP(6)`,
      })
      .where(and(eq(boards.id, boardId), eq(boards.teamId, teamId)));
    const saved = await findBoard(tx, { teamId, boardId });
    await recordAudit(tx, {
      teamId,
      actorId,
      action: "board.saved",
      detail: { board: boardId, title: saved!.title, version: saved!.version },
    });
    return dto(saved!);
  });
}

/** Deletes a board, based on the version the editor read (an older one: 409 with the board as it is now). */
export async function deleteBoard({
  teamId,
  boardId,
  actorId,
  version,
}: {
  teamId: number;
  boardId: number;
  actorId: string;
  version: number;
}): Promise<void> {
  await getDb().transaction(async (tx) => {
    const board = await lockedAtVersion(tx, {
      teamId,
      boardId,
      version,
      conflict: "Someone saved this board after you opened it. Look at it as it is now before you delete it.",
    });
    await tx.delete(boards).where(and(eq(boards.id, boardId), eq(boards.teamId, teamId)));
    await recordAudit(tx, {
      teamId,
      actorId,
      action: "board.deleted",
      detail: { board: boardId, title: board.title, version: board.version },
    });
  });
}
