import "server-only";
import { AppError } from "@/lib/errors";
import { requireRole } from "./authz";
import type { Role } from "./db/schema";
import type { TeamDto } from "@/lib/dto";
import { getTeamBySlug } from "./db/queries/teams";
import type { SessionUser } from "./auth";

/**
 * Loads a team by slug and checks the user's role in it, as every team route does after the
 * session: an unknown team and a team the user is not in both answer 404.
 */
export async function loadTeamFor({
  slug,
  user,
  needed,
}: {
  slug: string;
  user: SessionUser;
  needed: Role;
}): Promise<{ team: TeamDto; role: Role }> {
  const team = await getTeamBySlug({ slug });
  if (!team) throw new AppError("not_found", "No such team.");
  const role = await requireRole({ teamId: team.id, userId: user.id, needed });
  return { team, role };
}
