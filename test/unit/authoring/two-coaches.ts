import { eq } from "drizzle-orm";
import { getDb } from "@/server/db";
import { createCharacter, createGame } from "@/server/db/queries/authoring";
import { createTeam } from "@/server/db/queries/teams";
import { memberships, teams } from "@/server/db/schema";
import { makeUser } from "../teams/fixtures";

/** A team of two coaches (the first its owner) with a new game whose first Edition is a draft with one character. */
export async function twoCoachesAndADraft(names: {
  team: string;
  game: string;
  character: string;
  users: [string, string];
}) {
  const coaches = [await makeUser(names.users[0]), await makeUser(names.users[1])];
  const team = await createTeam({ name: names.team, ownerId: coaches[0]!.id });
  await getDb().insert(memberships).values({ teamId: team.id, userId: coaches[1]!.id, role: "coach" });
  const made = await createGame({ teamId: team.id, actorId: coaches[0]!.id, input: { name: names.game } });
  const character = await createCharacter({
    teamId: team.id,
    gameId: made.game.id,
    actorId: coaches[0]!.id,
    input: { name: names.character },
  });
  return {
    teamId: team.id,
    game: made.game,
    edition: made.edition,
    characterId: character.id,
    character: character.slug,
    coaches,
    /** Deletes the team and with it everything made here. */
    async remove() {
      const db = getDb();
      await db.delete(teams).where(eq(teams.id, team.id));
    },
  };
}

export type TwoCoaches = Awaited<ReturnType<typeof twoCoachesAndADraft>>;
