import "server-only";
import { and, asc, desc, eq, inArray, isNull, or } from "drizzle-orm";
import { getDb } from "../index";
import { characters, editions, games, memberships } from "../schema";

export interface GameSummary {
  id: number;
  slug: string;
  name: string;
  summary: string | null;
  fps: number;
  fastest: number;
  launchAt: number;
  /** The owning team; null for a public game, which everyone reads. */
  teamId: number | null;
}

export interface EditionSummary {
  id: number;
  slug: string;
  name: string;
  releasedOn: string;
  /** A draft is still being edited; a published Edition is frozen for good. */
  status: "draft" | "published";
}

export interface CharacterSummary {
  id: number;
  slug: string;
  name: string;
  summary: string | null;
}

const gameColumns = {
  id: games.id,
  slug: games.slug,
  name: games.name,
  summary: games.summary,
  fps: games.fps,
  fastest: games.fastest,
  launchAt: games.launchAt,
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
