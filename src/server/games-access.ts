import "server-only";
import { AppError } from "@/lib/errors";
import type { SessionUser } from "./auth";
import { requireRole } from "./authz";
import type { GameSummary } from "./db/queries/games";

/**
 * Reading a game: a public game (no team) is open to everyone; a team's game to its members,
 * any role. Signed out → 401; not a member → 404, the same as a game that does not exist.
 */
export async function checkGameRead({
  game,
  user,
}: {
  game: Pick<GameSummary, "teamId">;
  user: SessionUser | null;
}): Promise<void> {
  if (game.teamId === null) return;
  if (!user) throw new AppError("unauthorized", "Sign in to see this team's game.");
  await requireRole({ teamId: game.teamId, userId: user.id, needed: "viewer" });
}
