import "server-only";
import { and, asc, desc, eq, inArray, isNull, or } from "drizzle-orm";
import type { RangeKind, RangeScale } from "@/lib/engine";
import { AppError } from "@/lib/errors";
import { getDb } from "../index";
import type { Executor } from "./audit";
import { characters, editions, games, memberships } from "../schema";

export interface GameSummary {
  id: number;
  slug: string;
  name: string;
  summary: string | null;
  fps: number;
  fastest: number;
  launchAt: number;
  /** How the game measures range (labels, or numbers in `rangeUnit`). */
  rangeKind: RangeKind;
  rangeUnit: string | null;
  /** The owning team; null for a public game, which everyone reads. */
  teamId: number | null;
}

export interface EditionSummary {
  id: number;
  slug: string;
  name: string;
  releasedOn: string;
  /** A draft is still being edited (its team sees it); a published Edition never changes. */
  status: "draft" | "published";
}

export interface CharacterSummary {
  id: number;
  slug: string;
  name: string;
  summary: string | null;
}

/** A game's way of measuring range, as the engine's range functions take it. */
export function rangeScaleOf(game: Pick<GameSummary, "rangeKind" | "rangeUnit">): RangeScale {
  return { kind: game.rangeKind, unit: game.rangeUnit };
}

/** A game's way of measuring range, read inside a caller's transaction; a label scale for an unknown game. */
export async function gameRangeScale(db: Executor, gameId: number): Promise<RangeScale> {
  const [game] = await db
    .select({ rangeKind: games.rangeKind, rangeUnit: games.rangeUnit })
    .from(games)
    .where(eq(games.id, gameId));
  return game ? rangeScaleOf(game) : { kind: "label", unit: null };
}

const gameColumns = {
  id: games.id,
  slug: games.slug,
  name: games.name,
  summary: games.summary,
  fps: games.fps,
  fastest: games.fastest,
  launchAt: games.launchAt,
  rangeKind: games.rangeKind,
  rangeUnit: games.rangeUnit,
  teamId: games.teamId,
};

/** The games a viewer may read: the public ones, and their own teams' (none when signed out). */
export async function listGames({ viewerId = null }: { viewerId?: string | null } = {}): Promise<GameSummary[]> {
  const mine =
    viewerId === null
      ? []
      : await getDb().select({ teamId: memberships.teamId }).from(memberships).where(eq(memberships.userId, viewerId));
  const teamIds = mine.map((m) => m.teamId);
  return getDb()
    .select(gameColumns)
    .from(games)
    .where(teamIds.length === 0 ? isNull(games.teamId) : or(isNull(games.teamId), inArray(games.teamId, teamIds)))
    .orderBy(asc(games.name));
}

/** A team's own games, by name. */
export async function listTeamGames({ teamId }: { teamId: number }): Promise<GameSummary[]> {
  return getDb().select(gameColumns).from(games).where(eq(games.teamId, teamId)).orderBy(asc(games.name));
}

export async function getGameBySlug({ slug }: { slug: string }): Promise<GameSummary | null> {
  const [row] = await getDb().select(gameColumns).from(games).where(eq(games.slug, slug)).limit(1);
  return row ?? null;
}

/** Newest first: the first edition is the one views default to. */
export async function listEditions({ gameId }: { gameId: number }): Promise<EditionSummary[]> {
  const rows = await getDb()
    .select({
      id: editions.id,
      slug: editions.slug,
      name: editions.name,
      releasedOn: editions.releasedOn,
      status: editions.status,
    })
    .from(editions)
    .where(eq(editions.gameId, gameId))
    .orderBy(desc(editions.releasedOn), desc(editions.id));
  return rows.map((r) => ({ ...r, releasedOn: r.releasedOn.toISOString().slice(0, 10) }));
}

export async function listCharacters({ gameId }: { gameId: number }): Promise<CharacterSummary[]> {
  return getDb()
    .select({ id: characters.id, slug: characters.slug, name: characters.name, summary: characters.summary })
    .from(characters)
    .where(eq(characters.gameId, gameId))
    .orderBy(asc(characters.name));
}

export async function getCharacterBySlug({
  gameId,
  slug,
}: {
  gameId: number;
  slug: string;
}): Promise<CharacterSummary | null> {
  const [row] = await getDb()
    .select({ id: characters.id, slug: characters.slug, name: characters.name, summary: characters.summary })
    .from(characters)
    .where(and(eq(characters.gameId, gameId), eq(characters.slug, slug)))
    .limit(1);
  return row ?? null;
}

export async function getCharacterById({
  id,
}: {
  id: number;
}): Promise<{ character: CharacterSummary; game: GameSummary } | null> {
  const [row] = await getDb()
    .select({
      character: { id: characters.id, slug: characters.slug, name: characters.name, summary: characters.summary },
      game: gameColumns,
    })
    .from(characters)
    .innerJoin(games, eq(games.id, characters.gameId))
    .where(eq(characters.id, id))
    .limit(1);
  return row ?? null;
}

/**
 * A character a team may build on (a permalink, a board): one of the public demo game or of a
 * game the team owns. Another team's character answers exactly like one that does not exist.
 */
export async function characterForTeam({
  teamId,
  characterId,
}: {
  teamId: number;
  characterId: number;
}): Promise<{ character: CharacterSummary; game: GameSummary }> {
  const found = await getCharacterById({ id: characterId });
  if (!found || (found.game.teamId !== null && found.game.teamId !== teamId))
    throw new AppError("not_found", `There is no character ${characterId}.`);
  return found;
}

/** An Edition of the game by slug, with its status; a slug the game does not have is 404. */
export async function gameEdition({
  game,
  slug,
}: {
  game: Pick<GameSummary, "id" | "name">;
  slug: string;
}): Promise<{ id: number; slug: string; name: string; status: "draft" | "published" }> {
  const [edition] = await getDb()
    .select({ id: editions.id, slug: editions.slug, name: editions.name, status: editions.status })
    .from(editions)
    .where(and(eq(editions.gameId, game.id), eq(editions.slug, slug)))
    .limit(1);
  if (!edition) throw new AppError("not_found", `${game.name} has no Edition "${slug}".`);
  return edition;
}

/** A character of the same game, as a permalink's or a board's opponent; 400 naming it otherwise. */
export async function opponentInGame({
  opponentId,
  game,
}: {
  opponentId: number;
  game: Pick<GameSummary, "id" | "name">;
}): Promise<CharacterSummary> {
  const found = await getCharacterById({ id: opponentId });
  if (!found || found.game.id !== game.id)
    throw new AppError("bad_request", `The opponent ${opponentId} is not in ${game.name}.`);
  return found.character;
}
