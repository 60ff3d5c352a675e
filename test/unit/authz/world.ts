import { eq } from "drizzle-orm";
import { exportCharacterCsv } from "@/lib/character-file";
import type { BoardDocument } from "@/lib/board";
import type { Role } from "@/lib/roles";
import { getDb } from "@/server/db";
import { startEdition } from "@/server/db/queries/authoring";
import { createBoard } from "@/server/db/queries/boards";
import { getCharacterBySlug, getGameBySlug } from "@/server/db/queries/games";
import { createInvite } from "@/server/db/queries/invites";
import { createPermalink } from "@/server/db/queries/permalinks";
import { createTeam } from "@/server/db/queries/teams";
import { characters, edges, editions, games, memberships, moves } from "@/server/db/schema";
import { makeUser } from "../teams/fixtures";

export const VIEW = {
  root: "v",
  path: null,
  options: { maxDepth: 8, maxStanceVisits: 1, fastest: 10 },
  opponent: null,
};

/** A move row to write into a draft Edition: a mid poke, -2 on block. */
export function oneMove(editionId: number, characterId: number, key: string) {
  return {
    editionId,
    characterId,
    key,
    input: key,
    name: `Poke ${key}`,
    level: "mid" as const,
    damage: 10,
    startup: 12,
    onBlock: -2,
    onHit: 3,
    onCounterHit: 5,
    tags: [],
  };
}

/** One team with a member of each role, another team owned by the outsider, and what the routes act on. */
export async function world() {
  const people = {
    owner: await makeUser("owner"),
    coach: await makeUser("coach"),
    player: await makeUser("player"),
    viewer: await makeUser("viewer"),
    outsider: await makeUser("outsider"),
    extra: await makeUser("extra"),
  };
  const team = await createTeam({ name: `Matrix ${people.owner.id.slice(0, 6)}`, ownerId: people.owner.id });
  const roles: [keyof typeof people, Role][] = [
    ["coach", "coach"],
    ["player", "player"],
    ["viewer", "viewer"],
    ["extra", "player"],
  ];
  await getDb()
    .insert(memberships)
    .values(roles.map(([who, role]) => ({ teamId: team.id, userId: people[who].id, role })));
  const other = await createTeam({ name: `Elsewhere ${people.outsider.id.slice(0, 6)}`, ownerId: people.outsider.id });
  const pending = await createInvite({
    teamId: team.id,
    invitedBy: people.owner.id,
    inviterRole: "owner",
    email: `invitee-${people.owner.id.slice(0, 8)}@example.test`,
    role: "player",
  });
  // A game of the team's own, with one character and one published Edition holding one move.
  const db = getDb();
  const teamGameSlug = `team-game-${people.owner.id.slice(0, 8)}`;
  const [game] = await db
    .insert(games)
    .values({ slug: teamGameSlug, name: "Team Game", teamId: team.id })
    .$returningId();
  const [edition] = await db
    .insert(editions)
    .values({ gameId: game!.id, slug: "0-1", name: "0.1", releasedOn: new Date("2026-10-01") })
    .$returningId();
  const [character] = await db
    .insert(characters)
    .values({ gameId: game!.id, slug: "sparring-dummy", name: "Sparring Dummy" })
    .$returningId();
  await db.insert(moves).values(["1", "1,1", "2"].map((key) => oneMove(edition!.id, character!.id, key)));
  // "1,1" follows "1"; "2" stands alone, so a link to it can be added.
  const moveId = new Map(
    (await db.select({ id: moves.id, key: moves.key }).from(moves).where(eq(moves.editionId, edition!.id))).map((m) => [
      m.key,
      m.id,
    ]),
  );
  await db.insert(edges).values({
    editionId: edition!.id,
    characterId: character!.id,
    key: "1>1,1",
    kind: "follow",
    fromMoveId: moveId.get("1")!,
    toMoveId: moveId.get("1,1")!,
    input: ",1",
    gapOnBlock: 2,
    comboOnHit: true,
    comboOnCounterHit: false,
  });
  await db
    .update(editions)
    .set({ status: "published", publishedAt: new Date("2026-10-01") })
    .where(eq(editions.id, edition!.id));
  // A link the player shared from the public demo game.
  const demo = await getGameBySlug({ slug: "vesper-circuit" });
  const tarrow = demo && (await getCharacterBySlug({ gameId: demo.id, slug: "tarrow" }));
  if (!tarrow) throw new Error("the demo data is not in the test database");
  const shared = await createPermalink({
    teamId: team.id,
    createdBy: people.player.id,
    characterId: tarrow.id,
    editionSlug: "1-1",
    view: VIEW,
    visibility: "team",
  });
  // A board the team's coach made on the team's own game, and a link the player shared to it.
  const board = await createBoard({
    teamId: team.id,
    actorId: people.coach.id,
    characterId: character!.id,
    editionSlug: "0-1",
    opponentId: null,
    title: "Pressure after the poke",
    origin: { root: "1", path: null },
    document: boardDocument(),
  });
  return {
    people,
    team,
    other,
    board,
    pending,
    teamGame: { id: game!.id, slug: teamGameSlug },
    teamCharacterId: character!.id,
    demoCharacterId: tarrow.id,
    shared,
  };
}

export type World = Awaited<ReturnType<typeof world>>;

/**
 * A small valid board: after a poke, the attacker goes on or stops, the defender presses or
 * blocks; going on against a press leads to a second situation. The numbers are invented.
 */
export function boardDocument(): BoardDocument {
  const cell = (override: number, next: string | null = null) => ({ basis: null, override, next });
  return {
    root: "after-poke",
    values: {
      plusFrame: 1,
      minusFrame: 2,
      states: { knockdown: 20, launch: 40, "wall-splat": 30, crumple: 25, throw: 15 },
      whiff: 10,
    },
    situations: [
      {
        id: "after-poke",
        name: "After the poke",
        note: "",
        rows: ["Go on", "Stop"],
        cols: ["Press", "Block"],
        cells: [
          [cell(12, "scramble"), cell(-8)],
          [cell(-10), cell(0)],
        ],
      },
      {
        id: "scramble",
        name: "Scramble",
        note: "Both act at once.",
        rows: ["Jab"],
        cols: ["Duck", "Stand"],
        cells: [[cell(-5), cell(6)]],
      },
    ],
  };
}

/** The body of POST /api/teams/[team]/boards for the team game's character. */
export const newBoard = (w: Pick<World, "teamCharacterId">) => ({
  characterId: w.teamCharacterId,
  edition: "0-1",
  title: "Pressure after the poke",
  origin: { root: "1", path: null },
  document: boardDocument(),
});

/** The body of POST /api/permalinks sharing the demo's Drift stance sheet (Tarrow, 1-1) through the team. */
export const newStanceLink = (w: Pick<World, "team" | "demoCharacterId">, visibility: "team" | "link" = "link") => ({
  kind: "stance",
  teamId: w.team.id,
  characterId: w.demoCharacterId,
  edition: "1-1",
  view: { stance: "drift" },
  visibility,
});

/** The body of PUT /api/teams/[team]/boards/[board]: the first version, retitled. */
/** A good body for POST /api/teams/[team]/games: every setting given, range in numbers. */
export const newGame = (name: string) => ({
  name,
  fps: 60,
  fastest: 10,
  launchAt: 15,
  rangeKind: "number",
  rangeUnit: "m",
  edition: "1.0",
});

export const boardSave = () => ({ version: 1, title: "Pressure, second look", document: boardDocument() });

/** A draft Edition of the team's game (the next one, started by its owner), for the changes only a draft takes. */
export async function draftOf(w: World): Promise<string> {
  const draft = await startEdition({
    teamId: w.team.id,
    gameId: w.teamGame.id,
    actorId: w.people.owner.id,
    input: { name: `Draft ${Math.random().toString(36).slice(2, 8)}` },
  });
  return draft.slug;
}

/** A character file (CSV) of one move for the character with this slug, as an upload's form. */
export function characterForm(slug: string, name = "Sparring Dummy"): FormData {
  const csv = exportCharacterCsv({
    character: { slug, name, summary: null },
    stances: [],
    moves: [
      {
        key: "1",
        input: "1",
        name: "Jab",
        level: "high",
        damage: 5,
        startup: 10,
        onBlock: 1,
        onHit: 8,
        onCounterHit: 8,
        range: null,
        tags: [],
        notes: null,
        fromPosture: "standing",
        stance: null,
      },
    ],
    edges: [],
  });
  const form = new FormData();
  form.set("file", new File([csv], `${slug}.csv`, { type: "text/csv" }));
  return form;
}

/** A body that links two moves of the team game's character ("1" to "2", which nothing leads into yet). */
export const newLink = () => ({
  edge: { kind: "follow", from: "1", to: "2", input: ",2", gapOnBlock: 5, comboOnHit: false, comboOnCounterHit: false },
});

/** A body that adds a follow-up of "1" to the team game's character. */
export const newFollowUp = () => ({
  move: { input: "3", name: "Late Poke", level: "mid", damage: 9, onBlock: -3, onHit: 2, onCounterHit: 4, tags: ["x"] },
  via: { kind: "follow", from: "1", input: ",3", gapOnBlock: 2, comboOnHit: true, comboOnCounterHit: false },
});
