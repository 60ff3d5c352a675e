import type { MyTeamDto } from "./dto";
import { atLeast } from "./roles";

/**
 * What a reader's teams allow beside a view: sharing it (player or higher) and
 * making a Mix-up board from it (coach or owner). Signed out: neither.
 */
export function readerActions(teams: MyTeamDto[] | null) {
  if (!teams) return { share: undefined, boards: undefined };
  return {
    share: { teams: teams.filter((t) => atLeast(t.role, "player")).map((t) => ({ id: t.id, name: t.name })) },
    boards: { teams: teams.filter((t) => atLeast(t.role, "coach")).map((t) => ({ slug: t.slug, name: t.name })) },
  };
}
