import type { NewGame } from "@/lib/authoring";
import { and, count, eq } from "drizzle-orm";
import type { PortableCharacter, PortableMove } from "@/lib/character-file";
import { getDb } from "@/server/db";
import { createGame } from "@/server/db/queries/authoring";
import { importCharacter } from "@/server/db/queries/character-io";
import { createTeam } from "@/server/db/queries/teams";
import { auditLog, characters, edges, moves, stances } from "@/server/db/schema";
import { makeUser } from "../teams/fixtures";

/** A coach's team with a game of its own: its first Edition is a draft, and it has one character. */
export async function teamWithDraft(
  character: { slug: string; name: string; summary: string | null },
  /** The game's settings beyond its name, e.g. a numeric range. */
  settings: Omit<NewGame, "name"> = {},
) {
  const coach = await makeUser("coach");
  const team = await createTeam({ name: `Import Crew ${coach.id.slice(0, 6)}`, ownerId: coach.id });
  const { game, edition } = await createGame({
    teamId: team.id,
    actorId: coach.id,
    input: { name: `Import Game ${coach.id.slice(0, 6)}`, edition: "1.0", ...settings },
  });
  const [made] = await getDb()
    .insert(characters)
    .values({ gameId: game.id, ...character })
    .$returningId();
  return { coach, team, game, edition, characterId: made!.id };
}

/** The rows a character has in an Edition, and the team's log: what an import may write. */
export async function rowCounts({
  editionId,
  characterId,
  teamId,
}: {
  editionId: number;
  characterId: number;
  teamId: number;
}) {
  const db = getDb();
  const of = async (t: typeof stances | typeof moves | typeof edges) =>
    Number(
      (
        await db
          .select({ n: count() })
          .from(t)
          .where(and(eq(t.editionId, editionId), eq(t.characterId, characterId)))
      )[0]?.n,
    );
  return {
    stances: await of(stances),
    moves: await of(moves),
    edges: await of(edges),
    audit: Number((await db.select({ n: count() }).from(auditLog).where(eq(auditLog.teamId, teamId)))[0]?.n),
  };
}

export type Target = Awaited<ReturnType<typeof teamWithDraft>>;

/** Imports a character into the target's draft as its coach; `apply: false` for a preview. */
export function importInto(t: Target, character: PortableCharacter, apply = true) {
  return importCharacter({
    teamId: t.team.id,
    gameId: t.game.id,
    editionId: t.edition.id,
    characterId: t.characterId,
    actorId: t.coach.id,
    character,
    apply,
  });
}

/** A move with plain numbers, and these fields. */
export const move = (key: string, fields: Partial<PortableMove> = {}): PortableMove => ({
  key,
  input: key,
  name: `Move ${key}`,
  level: "mid",
  damage: 12,
  startup: 14,
  onBlock: -4,
  onHit: 3,
  onCounterHit: 5,
  range: null,
  tags: [],
  notes: null,
  fromPosture: "standing",
  stance: null,
  ...fields,
});
