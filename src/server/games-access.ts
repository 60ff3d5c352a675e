import "server-only";
import type { EditScope } from "@/server/db/queries/character-edits";
import { AppError } from "@/lib/errors";
import type { Role } from "@/lib/roles";
import { auth, type SessionUser } from "./auth";
import { atLeast, getRole } from "./authz";
import {
  getCharacterBySlug,
  getGameBySlug,
  listEditions,
  type CharacterSummary,
  type GameSummary,
} from "./db/queries/games";

/**
 * Whether the viewer may read a game: a public game (no team) is open to
 * everyone; a team's game to its members, any role. Callers answer "no" with
 * the same not-found as for a game that does not exist, signed in or not, so
 * nobody learns that a private game is there.
 */
export async function canReadGame({
  game,
  user,
}: {
  game: Pick<GameSummary, "teamId">;
  user: SessionUser | null;
}): Promise<boolean> {
  if (game.teamId === null) return true;
  if (!user) return false;
  return (await getRole({ teamId: game.teamId, userId: user.id })) !== null;
}

/**
 * Loads a game for a change: its team's coaches and owners may change it. A game that does not
 * exist and a team's game the user is not in both answer the same 404; a member below coach gets
 * 403; the public demo game, which belongs to no team, is read-only to everyone.
 */
export async function loadGameForEdit({
  slug,
  user,
}: {
  slug: string;
  user: SessionUser;
}): Promise<{ game: GameSummary & { teamId: number }; role: Role }> {
  const game = await getGameBySlug({ slug });
  if (!game) throw new AppError("not_found", "No such game.");
  if (game.teamId === null)
    throw new AppError("forbidden", "The demo game is read-only. Create a game for your team to edit frame data.");
  const role = await getRole({ teamId: game.teamId, userId: user.id });
  // Someone outside the team learns nothing: the same answer as for a game that does not exist.
  if (role === null) throw new AppError("not_found", "No such game.");
  if (!atLeast(role, "coach"))
    throw new AppError("forbidden", `Changing a game's frame data needs the coach role or higher; you are a ${role}.`);
  return { game: { ...game, teamId: game.teamId }, role };
}

/**
 * Loads a game for reading: the public demo game for everyone, a team's game for its members
 * (any role). Anyone else, signed in or not, gets the answer a game that does not exist gets.
 */
export async function loadGameForRead({ slug }: { slug: string }): Promise<GameSummary> {
  const game = await getGameBySlug({ slug });
  const readable = game !== null && (await canReadGame({ game, user: game.teamId === null ? null : await auth() }));
  if (!readable) throw new AppError("not_found", "No such game.");
  return game;
}

/** A character of the game, by slug; another game's character is not found. */
export async function characterOf(gameId: number, slug: string): Promise<CharacterSummary> {
  const character = await getCharacterBySlug({ gameId, slug });
  if (!character) throw new AppError("not_found", "No such character in this game.");
  return character;
}

/** An Edition of the game, by slug. */
export async function editionOf(gameId: number, slug: string): Promise<{ id: number; slug: string; name: string }> {
  const edition = (await listEditions({ gameId })).find((e) => e.slug === slug);
  if (!edition) throw new AppError("not_found", "No such Edition of this game.");
  return edition;
}

/** The character of an Edition a request names, loaded for a change (`loadGameForEdit`'s checks first). */
export async function characterForEdit(
  params: { game: string; edition: string; character: string },
  user: SessionUser,
): Promise<EditScope> {
  const { game } = await loadGameForEdit({ slug: params.game, user });
  const edition = await editionOf(game.id, params.edition);
  const character = await characterOf(game.id, params.character);
  return { teamId: game.teamId, gameId: game.id, editionId: edition.id, characterId: character.id, actorId: user.id };
}
