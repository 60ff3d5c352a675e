import { randomBytes } from "node:crypto";
import { afterAll, beforeAll } from "vitest";
import { inArray } from "drizzle-orm";
import { closeDb, getDb } from "@/server/db";
import { getCharacterBySlug, getGameBySlug } from "@/server/db/queries/games";
import { memberships, teams, users, type Role } from "@/server/db/schema";
import type { PermalinkView } from "@/lib/permalink";
import { DEMO_GAME } from "@/server/db/seed/demo";

/** Throwaway people and teams for one test file, inserted directly and removed after. */
export function makePeople() {
  const tag = randomBytes(4).toString("hex");
  const userIds: string[] = [];
  const teamIds: number[] = [];
  return {
    async user(name: string | null = `Tester ${userIds.length}`): Promise<string> {
      const id = `u-${tag}-${userIds.length}`;
      await getDb()
        .insert(users)
        .values({ id, name, email: `${id}@example.test` });
      userIds.push(id);
      return id;
    },
    async team(members: Record<string, Role> = {}): Promise<number> {
      const slug = `t-${tag}-${teamIds.length}`;
      const [row] = await getDb()
        .insert(teams)
        .values({ slug, name: `Team ${slug}` })
        .$returningId();
      if (!row) throw new Error("team insert returned no id");
      teamIds.push(row.id);
      for (const [userId, role] of Object.entries(members))
        await getDb().insert(memberships).values({ teamId: row.id, userId, role });
      return row.id;
    },
    async cleanup() {
      // Cascades take memberships, permalinks and audit entries with them.
      const db = getDb();
      if (teamIds.length > 0) await db.delete(teams).where(inArray(teams.id, teamIds));
      if (userIds.length > 0) await db.delete(users).where(inArray(users.id, userIds));
    },
  };
}

/** The demo game's Tarrow, seeded by `npm test`. */
export async function tarrow() {
  const game = await getGameBySlug({ slug: "vesper-circuit" });
  if (!game) throw new Error("the demo game is not in the test database");
  const character = await getCharacterBySlug({ gameId: game.id, slug: "tarrow" });
  if (!character) throw new Error("no demo character tarrow");
  return { game, character };
}

export const stringView = (over: Partial<PermalinkView> = {}): PermalinkView => ({
  root: "v",
  path: "v>v.v|v.v>v.v.t",
  options: { maxDepth: 8, maxStanceVisits: 1, fastest: DEMO_GAME.fastest },
  opponent: null,
  ...over,
});

/** One player in one throwaway team, made before the file's tests and removed after them. */
export function playerInTeam(name: string) {
  const people = makePeople();
  const ctx = { player: "", team: 0, characterId: 0 };
  beforeAll(async () => {
    ctx.player = await people.user(name);
    ctx.team = await people.team({ [ctx.player]: "player" });
    ctx.characterId = (await tarrow()).character.id;
  });
  afterAll(async () => {
    await people.cleanup();
    await closeDb();
  });
  return ctx;
}
