import "server-only";
import type { SessionUser } from "./auth";
import { getRole } from "./authz";
import type { GameSummary } from "./db/queries/games";

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
