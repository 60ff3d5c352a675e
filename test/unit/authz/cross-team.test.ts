import { randomBytes, randomUUID } from "node:crypto";
import { beforeEach, describe, expect, test, vi } from "vitest";
import type { SessionUser } from "@/server/auth";
import { createInvite } from "@/server/db/queries/invites";
import { createCharacter, createGame, publishEdition } from "@/server/db/queries/authoring";
import { createPermalink } from "@/server/db/queries/permalinks";
import { createBoard } from "@/server/db/queries/boards";
import { importCharacter, loadPortableCharacter } from "@/server/db/queries/character-io";
import { createTeam } from "@/server/db/queries/teams";
import { getDb } from "@/server/db";
import { memberships, moves } from "@/server/db/schema";
import { makeUser } from "../teams/fixtures";
import { inlineServerActions, missingRows, routeHandlers, routeUrl, serverActions } from "./inventory";
import { tableChecksums, runOnPrivateDatabase } from "./private-database";
import { setSession } from "./session-mock";
import { boardDocument, boardSave, characterForm, newBoard, oneMove, VIEW, world } from "./world";

// The cross-team matrix: the owner of team B sends team A's ids in every path parameter, query
// field and body field of every route, and each answer must be the one an id that does not
// exist gets, byte for byte, with nothing written. A difference of status or wording would tell
// a stranger that team A's character, invite, member or link exists.

vi.mock("@/server/auth", () => import("./session-mock"));
vi.mock("@/server/mail", () => import("./mail-mock"));
vi.mock("next/headers", () => import("./headers-mock"));

runOnPrivateDatabase();
beforeEach(() => setSession(null));

/** The role matrix's world (team A with a member of each role; team B owned by the outsider), and team B's own things. */
async function crossWorld() {
  const w = await world();
  const b = w.other;
  const bPlayer = await makeUser("b-player");
  await getDb().insert(memberships).values({ teamId: b.id, userId: bPlayer.id, role: "player" });
  const bInvite = await createInvite({
    teamId: b.id,
    invitedBy: w.people.outsider.id,
    inviterRole: "owner",
    email: `b-invitee-${b.slug}@example.test`,
    role: "viewer",
  });
  const bLink = await createPermalink({
    teamId: b.id,
    createdBy: w.people.outsider.id,
    characterId: w.demoCharacterId,
    editionSlug: "1-1",
    view: VIEW,
    visibility: "team",
  });
  // A third team invites B's owner, so B's owner has an invite of their own to accept.
  const thirdOwner = await makeUser("third-owner");
  const third = await createTeam({ name: `Third ${thirdOwner.id.slice(0, 6)}`, ownerId: thirdOwner.id });
  const forCaller = await createInvite({
    teamId: third.id,
    invitedBy: thirdOwner.id,
    inviterRole: "owner",
    email: w.people.outsider.email,
    role: "player",
  });
  // Team B's own game, its first Edition still a draft, with one character; and one whose only
  // Edition is published, so the next one can be started.
  const asB = { teamId: b.id, actorId: w.people.outsider.id };
  const bGame = await createGame({ ...asB, input: { name: `B Game ${b.slug.slice(-6)}` } });
  const bFighter = await createCharacter({ ...asB, gameId: bGame.game.id, input: { name: "B Fighter" } });
  await getDb()
    .insert(moves)
    .values(["b1", "b2", "b3"].map((key) => oneMove(bGame.edition.id, bFighter.id, key)));
  await importCharacter({
    ...asB,
    gameId: bGame.game.id,
    editionId: bGame.edition.id,
    characterId: bFighter.id,
    apply: true,
    character: {
      ...(await loadPortableCharacter({ editionId: bGame.edition.id, characterId: bFighter.id }))!,
      edges: [
        { kind: "follow", from: "b1", to: "b3", input: ",3", gapOnBlock: 1, comboOnHit: true, comboOnCounterHit: true },
      ],
    },
  });
  const bDone = await createGame({ ...asB, input: { name: `B Done ${b.slug.slice(-6)}` } });
  await publishEdition({ ...asB, gameId: bDone.game.id, editionId: bDone.edition.id });
  // Team B's own board, on its draft.
  const bBoard = await createBoard({
    ...asB,
    characterId: bFighter.id,
    editionSlug: bGame.edition.slug,
    opponentId: null,
    title: "B's board",
    origin: null,
    document: boardDocument(),
  });
  return {
    ...w,
    b: {
      publishedGame: bDone.game,
      team: b,
      player: bPlayer,
      invite: bInvite,
      link: bLink,
      tokenForCaller: forCaller.token,
      game: bGame.game,
      edition: bGame.edition.slug,
      board: bBoard,
    },
  };
}
type CrossWorld = Awaited<ReturnType<typeof crossWorld>>;

type Id = string | number;
interface IdField {
  /** Where the id travels: a path parameter, a query field, or a body field (dots for nested ones). */
  in: "path" | "query" | "body";
  name: string;
  /** Team A's real id. */
  teamA: (w: CrossWorld) => Id;
  /** An id of the same shape that names nothing. */
  none: (w: CrossWorld) => Id;
}
interface Call {
  params?: Record<string, string>;
  query?: Record<string, string>;
  body?: Record<string, unknown>;
  /** A file upload (multipart/form-data) for the character with this slug. */
  file?: string;
}
interface RouteRow {
  /** A call team B's owner may make in their own team, which succeeds; each id below replaces one of its values. */
  own: (w: CrossWorld) => Call;
  ids: IdField[];
}
/** A route that takes two kinds of body (a permalink to a view or to a board) has a row for each. */
type Row = RouteRow | RouteRow[] | { noIds: string } | { exempt: string };

// Nonexistent ids of each shape.
const noNumber = () => 3_000_000_000 + Math.floor(Math.random() * 1_000_000);
const noTeamSlug = (w: CrossWorld) => `${w.team.slug.slice(0, -6)}${randomBytes(3).toString("hex")}`;
const noToken = () => randomBytes(32).toString("base64url");

const TEAM: IdField = { in: "path", name: "team", teamA: (w) => w.team.slug, none: noTeamSlug };
const noSlug = () => `none-${randomBytes(4).toString("hex")}`;
const GAME: IdField = { in: "path", name: "game", teamA: (w) => w.teamGame.slug, none: noSlug };
// Team A's Edition and character, named by their slugs, which B's game does not have.
const EDITION: IdField = { in: "path", name: "edition", teamA: () => "0-1", none: () => "9-9" };
const MOVE: IdField = { in: "path", name: "move", teamA: () => "1", none: () => "no-such-move" };
const EDGE: IdField = { in: "path", name: "edge", teamA: () => "1>1,1", none: () => "no>such-link" };
const CHARACTER: IdField = { in: "path", name: "character", teamA: () => "sparring-dummy", none: noSlug };
const BOARD: IdField = { in: "path", name: "board", teamA: (w) => String(w.board.id), none: () => String(noNumber()) };
const boardParams = (w: CrossWorld) => ({ team: w.b.team.slug, board: String(w.b.board.id) });
const teamRoute = (own: (w: CrossWorld) => Call = (w) => ({ params: { team: w.b.team.slug } })): RouteRow => ({
  own,
  ids: [TEAM],
});

/** Every route handler: which of its inputs carry an id of a team's data. */
const ROUTES: Record<string, Row> = {
  "GET /api/health": { noIds: "liveness: no input" },
  "POST /api/paths": { noIds: "computes on the graph in the body; reads nothing stored" },
  "GET /api/auth/[...nextauth]": { exempt: "next-auth's own endpoints: sign-in takes an address, no team's id" },
  "POST /api/auth/[...nextauth]": { exempt: "next-auth's own endpoints: sign-in takes an address, no team's id" },
  "GET /api/teams": { noIds: "the caller's own teams" },
  "POST /api/teams": { noIds: "a new team's name" },
  "GET /api/characters/[id]/graph": {
    own: (w) => ({ params: { id: String(w.demoCharacterId) }, query: { edition: "1-1" } }),
    ids: [
      { in: "path", name: "id", teamA: (w) => String(w.teamCharacterId), none: () => String(noNumber()) },
      // Team A's Edition; with the public character it names an Edition that game does not have.
      { in: "query", name: "edition", teamA: () => "0-1", none: () => "9-9" },
    ],
  },
  "GET /api/teams/[team]/members": teamRoute(),
  "GET /api/teams/[team]/invites": teamRoute(),
  "GET /api/teams/[team]/audit": teamRoute(),
  "GET /api/teams/[team]/permalinks": teamRoute(),
  "POST /api/teams/[team]/invites": teamRoute((w) => ({
    params: { team: w.b.team.slug },
    body: { email: `new-${randomUUID().slice(0, 8)}@example.test`, role: "player" },
  })),
  "DELETE /api/teams/[team]/invites/[invite]": {
    own: (w) => ({ params: { team: w.b.team.slug, invite: String(w.b.invite.invite.id) } }),
    ids: [
      TEAM,
      { in: "path", name: "invite", teamA: (w) => String(w.pending.invite.id), none: () => String(noNumber()) },
    ],
  },
  "PATCH /api/teams/[team]/members/[user]": {
    own: (w) => ({ params: { team: w.b.team.slug, user: w.b.player.id }, body: { role: "coach" } }),
    ids: [TEAM, { in: "path", name: "user", teamA: (w) => w.people.extra.id, none: () => randomUUID() }],
  },
  "DELETE /api/teams/[team]/members/[user]": {
    own: (w) => ({ params: { team: w.b.team.slug, user: w.b.player.id } }),
    ids: [TEAM, { in: "path", name: "user", teamA: (w) => w.people.extra.id, none: () => randomUUID() }],
  },
  "POST /api/teams/[team]/games": teamRoute((w) => ({
    params: { team: w.b.team.slug },
    body: { name: "Cross Rumble" },
  })),
  "POST /api/games/[game]/characters": {
    own: (w) => ({ params: { game: w.b.game.slug }, body: { name: "New Fighter" } }),
    ids: [GAME],
  },
  "POST /api/games/[game]/editions": {
    own: (w) => ({ params: { game: w.b.publishedGame.slug }, body: { name: "2.0" } }),
    ids: [GAME],
  },
  "POST /api/games/[game]/editions/[edition]/publish": {
    own: (w) => ({ params: { game: w.b.game.slug, edition: w.b.edition } }),
    ids: [GAME, EDITION],
  },
  "POST /api/games/[game]/editions/[edition]/characters/[character]/stances": {
    own: (w) => ({
      params: { game: w.b.game.slug, edition: w.b.edition, character: "b-fighter" },
      body: { key: "low", name: "Low Guard", abbreviation: "LG" },
    }),
    ids: [GAME, EDITION, CHARACTER],
  },
  "POST /api/games/[game]/editions/[edition]/characters/[character]/import": {
    own: (w) => ({
      params: { game: w.b.game.slug, edition: w.b.edition, character: "b-fighter" },
      query: { preview: "1" },
      file: "b-fighter",
    }),
    ids: [GAME, EDITION, CHARACTER],
  },
  "GET /api/games/[game]/editions/[edition]/characters/[character]/export": {
    own: (w) => ({ params: { game: w.b.game.slug, edition: w.b.edition, character: "b-fighter" } }),
    ids: [GAME, EDITION, CHARACTER],
  },
  "GET /api/games/[game]/editions/[edition]/export": {
    own: (w) => ({ params: { game: w.b.game.slug, edition: w.b.edition }, query: { format: "json" } }),
    ids: [GAME, EDITION],
  },
  "PATCH /api/games/[game]/editions/[edition]/characters/[character]/moves/[move]": {
    own: (w) => ({
      params: { game: w.b.game.slug, edition: w.b.edition, character: "b-fighter", move: "b1" },
      body: { version: 1, changes: { damage: 14 } },
    }),
    ids: [GAME, EDITION, CHARACTER, MOVE],
  },
  "GET /api/games/[game]/editions/[edition]/characters/[character]/moves/[move]": {
    own: (w) => ({ params: { game: w.b.game.slug, edition: w.b.edition, character: "b-fighter", move: "b1" } }),
    ids: [GAME, EDITION, CHARACTER, MOVE],
  },
  "DELETE /api/games/[game]/editions/[edition]/characters/[character]/moves/[move]": {
    own: (w) => ({
      params: { game: w.b.game.slug, edition: w.b.edition, character: "b-fighter", move: "b2" },
      query: { version: "1" },
    }),
    ids: [GAME, EDITION, CHARACTER, MOVE],
  },
  "POST /api/games/[game]/editions/[edition]/characters/[character]/moves": {
    own: (w) => ({
      params: { game: w.b.game.slug, edition: w.b.edition, character: "b-fighter" },
      body: {
        move: { input: "b9", name: "B Nine", level: "low", damage: 7, onBlock: -13, onHit: -2, onCounterHit: 1 },
        via: { kind: "follow", from: "b1", input: ",9", gapOnBlock: 8, comboOnHit: false, comboOnCounterHit: false },
      },
    }),
    ids: [GAME, EDITION, CHARACTER, { in: "body", name: "via.from", teamA: () => "1", none: () => "no-such-move" }],
  },
  "POST /api/games/[game]/editions/[edition]/characters/[character]/edges": {
    own: (w) => ({
      params: { game: w.b.game.slug, edition: w.b.edition, character: "b-fighter" },
      body: {
        edge: {
          kind: "follow",
          from: "b1",
          to: "b2",
          input: ",2",
          gapOnBlock: 4,
          comboOnHit: true,
          comboOnCounterHit: true,
        },
      },
    }),
    ids: [
      GAME,
      EDITION,
      CHARACTER,
      { in: "body", name: "edge.from", teamA: () => "1", none: () => "no-such-move" },
      { in: "body", name: "edge.to", teamA: () => "2", none: () => "no-such-move" },
    ],
  },
  "GET /api/games/[game]/editions/[edition]/characters/[character]/edges/[edge]": {
    own: (w) => ({ params: { game: w.b.game.slug, edition: w.b.edition, character: "b-fighter", edge: "b1>b3" } }),
    ids: [GAME, EDITION, CHARACTER, EDGE],
  },
  "PATCH /api/games/[game]/editions/[edition]/characters/[character]/edges/[edge]": {
    own: (w) => ({
      params: { game: w.b.game.slug, edition: w.b.edition, character: "b-fighter", edge: "b1>b3" },
      body: { version: 1, changes: { gapOnBlock: 9 } },
    }),
    ids: [GAME, EDITION, CHARACTER, EDGE],
  },
  "DELETE /api/games/[game]/editions/[edition]/characters/[character]/edges/[edge]": {
    own: (w) => ({
      params: { game: w.b.game.slug, edition: w.b.edition, character: "b-fighter", edge: "b1>b3" },
      query: { version: "1" },
    }),
    ids: [GAME, EDITION, CHARACTER, EDGE],
  },
  "DELETE /api/permalinks/[slug]": {
    own: (w) => ({ params: { slug: w.b.link.slug } }),
    ids: [{ in: "path", name: "slug", teamA: (w) => w.shared.slug, none: () => randomBytes(18).toString("base64url") }],
  },
  "POST /api/permalinks": [
    {
      own: (w) => ({
        body: { teamId: w.b.team.id, characterId: w.demoCharacterId, edition: "1-1", view: VIEW, visibility: "team" },
      }),
      ids: [
        { in: "body", name: "teamId", teamA: (w) => w.team.id, none: noNumber },
        { in: "body", name: "characterId", teamA: (w) => w.teamCharacterId, none: noNumber },
        { in: "body", name: "edition", teamA: () => "0-1", none: () => "9-9" },
        { in: "body", name: "view.opponent", teamA: (w) => w.teamCharacterId, none: noNumber },
      ],
    },
    {
      own: (w) => ({ body: { kind: "board", teamId: w.b.team.id, view: { board: w.b.board.id }, visibility: "link" } }),
      ids: [
        { in: "body", name: "teamId", teamA: (w) => w.team.id, none: noNumber },
        { in: "body", name: "view.board", teamA: (w) => w.board.id, none: noNumber },
      ],
    },
    {
      own: (w) => ({
        body: {
          kind: "stance",
          teamId: w.b.team.id,
          characterId: w.demoCharacterId,
          edition: "1-1",
          view: { stance: "drift" },
          visibility: "team",
        },
      }),
      ids: [
        { in: "body", name: "teamId", teamA: (w) => w.team.id, none: noNumber },
        { in: "body", name: "characterId", teamA: (w) => w.teamCharacterId, none: noNumber },
        { in: "body", name: "edition", teamA: () => "0-1", none: () => "9-9" },
      ],
    },
  ],
  "GET /api/teams/[team]/boards": teamRoute(),
  "POST /api/teams/[team]/boards": {
    // B's board on the demo game, against an opponent: each id of team A's answers as one that names nothing.
    own: (w) => ({
      params: { team: w.b.team.slug },
      body: { ...newBoard(w), characterId: w.demoCharacterId, edition: "1-1", opponentId: w.demoCharacterId },
    }),
    ids: [
      TEAM,
      { in: "body", name: "characterId", teamA: (w) => w.teamCharacterId, none: noNumber },
      { in: "body", name: "edition", teamA: () => "0-1", none: () => "9-9" },
      { in: "body", name: "opponentId", teamA: (w) => w.teamCharacterId, none: noNumber },
    ],
  },
  "GET /api/teams/[team]/boards/[board]": { own: (w) => ({ params: boardParams(w) }), ids: [TEAM, BOARD] },
  "PUT /api/teams/[team]/boards/[board]": {
    own: (w) => ({ params: boardParams(w), body: boardSave() }),
    ids: [TEAM, BOARD],
  },
  "DELETE /api/teams/[team]/boards/[board]": {
    own: (w) => ({ params: boardParams(w), query: { version: "1" } }),
    ids: [TEAM, BOARD],
  },
  "POST /api/invites/accept": {
    own: (w) => ({ body: { token: w.b.tokenForCaller } }),
    // Team A's invite, sent to someone else: the token is its whole secret.
    ids: [{ in: "body", name: "token", teamA: (w) => w.pending.token, none: noToken }],
  },
};

/** Every server action: the ones that take an id of a team's data get a RouteRow-like check here. */
const ACTIONS: Record<string, { noIds: string }> = {
  "(auth)/actions.ts signUp": { noIds: "a name, an address and a password" },
  "(auth)/actions.ts requestPasswordReset": { noIds: "an address; the answer is the same for any" },
  "(auth)/actions.ts resetPassword": { noIds: "a reset token is its account's own secret, not a team's" },
  "(auth)/actions.ts changePassword": { noIds: "the caller's own passwords" },
  "(auth)/actions.ts confirmEmail": { noIds: "a confirmation token is its account's own secret, not a team's" },
  "(auth)/actions.ts resendConfirmation": { noIds: "an address; the answer is the same for any" },
  "(auth)/actions.ts signOutEverywhere": { noIds: "the caller's own sessions" },
};

const CALLERS = ["team B's owner", "anonymous"] as const;
type Caller = (typeof CALLERS)[number];
const callerUser = (w: CrossWorld, caller: Caller): SessionUser | null =>
  caller === "anonymous"
    ? null
    : { id: w.people.outsider.id, email: w.people.outsider.email, name: w.people.outsider.name };

function withValue(call: Call, field: IdField, value: Id): Call {
  const out: Call = structuredClone(call);
  if (field.in === "path") out.params = { ...out.params, [field.name]: String(value) };
  else if (field.in === "query") out.query = { ...out.query, [field.name]: String(value) };
  else {
    out.body ??= {};
    const keys = field.name.split(".");
    let at = out.body;
    for (const k of keys.slice(0, -1)) at = at[k] as Record<string, unknown>;
    at[keys.at(-1)!] = value;
  }
  return out;
}

/** The answer as text, with the ids sent replaced by a placeholder: "There is no character 7." reads the same for any 7. */
function normalised(text: string, sent: Id[]): string {
  let out = text;
  for (const id of sent) {
    const s = String(id);
    out = out.replace(new RegExp(`(?<![\\w-])${s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}(?![\\w-])`, "g"), "<id>");
  }
  return out;
}

async function send(key: string, call: Call) {
  const handler = (await routeHandlers()).get(key)!;
  const [method, route] = key.split(" ") as [string, string];
  const query = call.query ? `?${new URLSearchParams(call.query).toString()}` : "";
  const request = new Request(routeUrl(route, call.params ?? {}, query), {
    method,
    ...(call.body === undefined
      ? {}
      : { body: JSON.stringify(call.body), headers: { "content-type": "application/json" } }),
    ...(call.file === undefined ? {} : { body: characterForm(call.file) }),
  });
  const res = await handler(request, { params: Promise.resolve(call.params ?? {}) });
  return { status: res.status, text: await res.text() };
}

describe("cross-team matrix", () => {
  test("every route handler and every server action has a row, and every row a route or an action", async () => {
    expect(missingRows((await routeHandlers()).keys(), ROUTES)).toEqual({ "no row": [], "row for nothing": [] });
    expect(missingRows((await serverActions()).keys(), ACTIONS)).toEqual({ "no row": [], "row for nothing": [] });
  });

  test("no server action hides inline, where no table can list it", () => {
    expect(inlineServerActions()).toEqual([]);
  });

  test('the checksums see a write (so "nothing is written" below can fail)', async () => {
    const before = await tableChecksums();
    const someone = await makeUser("writer");
    expect((await tableChecksums()).users).not.toBe(before.users);
    await createTeam({ name: "Written", ownerId: someone.id });
    const after = await tableChecksums();
    expect([after.teams, after.memberships, after.audit_log]).not.toContain(undefined);
    expect(after.teams).not.toBe(before.teams);
  });

  const cases = Object.entries(ROUTES).flatMap(([key, entry]) => {
    const rows = Array.isArray(entry) ? entry : "ids" in entry ? [entry] : [];
    return rows.flatMap((row, n) => {
      const sets: { what: string; fields: IdField[] }[] = row.ids.map((f) => ({ what: f.name, fields: [f] }));
      if (row.ids.length > 1) sets.push({ what: "every id", fields: row.ids });
      const variant = rows.length > 1 ? ` #${n + 1}` : "";
      return CALLERS.flatMap((caller) =>
        sets.map((s) => ({ name: `${key}${variant} · ${caller} · ${s.what}`, key, row, caller, ...s })),
      );
    });
  });

  for (const c of cases) {
    test(c.name, async () => {
      const w = await crossWorld();
      setSession(callerUser(w, c.caller));
      const own = c.row.own(w);
      const aIds = c.fields.map((f) => f.teamA(w));
      const noIds = c.fields.map((f) => f.none(w));
      const withA = c.fields.reduce((call, f, i) => withValue(call, f, aIds[i]!), own);
      const withNone = c.fields.reduce((call, f, i) => withValue(call, f, noIds[i]!), own);

      const before = await tableChecksums();
      const a = await send(c.key, withA);
      const none = await send(c.key, withNone);
      expect(await tableChecksums(), "nothing is written").toEqual(before);
      expect(none.status, "an id that names nothing is refused").toBeGreaterThanOrEqual(400);
      expect(
        { status: a.status, body: normalised(a.text, aIds) },
        "team A's id answers as one that names nothing",
      ).toEqual({ status: none.status, body: normalised(none.text, noIds) });

      // The same call with B's own ids goes through: the refusal above came from team A's id, not from the rest.
      if (c.caller === "team B's owner") expect((await send(c.key, own)).status).toBeLessThan(300);
    });
  }
});
