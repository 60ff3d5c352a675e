import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import { ERROR_STATUS } from "@/lib/errors";
import type { SessionUser } from "@/server/auth";
import { routeHandlers, routeUrl, serverActions, type Action } from "./inventory";
import { nextAddress } from "./headers-mock";
import { setSession } from "./session-mock";
import { closeDb } from "@/server/db";
import { boardSave, newStanceLink, characterForm, draftOf, newBoard, VIEW, world, type World, newLink } from "./world";
import { ONE_MOVE_PATHS_REQUEST } from "../../fixtures/paths-request";

// Who is signed in for the call under test. Route handlers read the session only through
// @/server/auth, so the matrix sets it here; everything else (database, role checks) is real.
vi.mock("@/server/auth", () => import("./session-mock"));
// Mail is recorded, not sent; each call comes from its own address (see the mocks).
vi.mock("@/server/mail", () => import("./mail-mock"));
vi.mock("next/headers", () => import("./headers-mock"));

afterAll(closeDb);
beforeEach(() => setSession(null));

const ACTORS = ["anonymous", "viewer", "player", "coach", "owner", "outsider"] as const;
type Actor = (typeof ACTORS)[number];
type Expected = Record<Actor, number>;

const userOf = (w: World, actor: Actor): SessionUser | null =>
  actor === "anonymous" ? null : { id: w.people[actor].id, email: w.people[actor].email, name: w.people[actor].name };

interface Case {
  /** What the call does, for the failure message. */
  what: string;
  call: (w: World) => Call | Promise<Call>;
  expect: Expected;
}

/** `form` is sent as multipart/form-data (a file upload), `body` as JSON; `headers` beside them. */
type Call = {
  params?: Record<string, string>;
  body?: unknown;
  form?: FormData;
  query?: string;
  headers?: Record<string, string>;
};

/**
 * The ETag of the graph API's answer to `who` (signed in as them, then signed out again), so a
 * row can send it back in If-None-Match after that answer has warmed any cache.
 */
async function graphEtag(w: World, who: Actor, id: number, query: string): Promise<string> {
  const graph = (await routeHandlers()).get("GET /api/characters/[id]/graph")!;
  setSession(userOf(w, who));
  const res = await graph(new Request(routeUrl("/api/characters/[id]/graph", { id: String(id) }, query)), {
    params: Promise.resolve({ id: String(id) }),
  });
  setSession(null);
  const etag = res.headers.get("etag");
  if (res.status !== 200 || etag === null) throw new Error(`${who} got ${res.status} without an ETag`);
  return etag;
}

const all = (status: number): Expected => ({
  anonymous: status,
  viewer: status,
  player: status,
  coach: status,
  owner: status,
  outsider: status,
});
const members = (ok: number): Expected => ({
  anonymous: 401,
  viewer: ok,
  player: ok,
  coach: ok,
  owner: ok,
  outsider: 404,
});
const atLeastCoach = (ok: number): Expected => ({
  anonymous: 401,
  viewer: 403,
  player: 403,
  coach: ok,
  owner: ok,
  outsider: 404,
});
const ownerOnly = (ok: number): Expected => ({
  anonymous: 401,
  viewer: 403,
  player: 403,
  coach: 403,
  owner: ok,
  outsider: 404,
});

/**
 * The one table: every route handler (file under src/app/api, and method) × every kind of
 * caller → the status it must answer. A route with no row fails the test below.
 */
const MATRIX: Record<string, Case[] | { exempt: string }> = {
  "GET /api/health": [{ what: "health", call: () => ({}), expect: all(200) }],
  "POST /api/paths": [
    {
      what: "explore a posted graph",
      call: () => ({ body: ONE_MOVE_PATHS_REQUEST }),
      expect: all(200),
    },
  ],
  "GET /api/characters/[id]/graph": [
    // Signed out, a private character is as unknown as to an outsider (not-yours.test.ts compares the bodies).
    {
      what: "a team's game",
      call: (w) => ({ params: { id: String(w.teamCharacterId) } }),
      expect: { ...members(200), anonymous: 404 },
    },
    {
      // A member's answer came first: whatever it warmed, a stranger sending its ETag is not told "unchanged".
      what: "a team's published Edition, sent the ETag a member got",
      call: async (w) => ({
        params: { id: String(w.teamCharacterId) },
        query: "?edition=0-1",
        headers: { "if-none-match": await graphEtag(w, "viewer", w.teamCharacterId, "?edition=0-1") },
      }),
      expect: { ...members(304), anonymous: 404 },
    },
    {
      what: "a team's draft",
      call: async (w) => ({ params: { id: String(w.teamCharacterId) }, query: `?edition=${await draftOf(w)}` }),
      expect: { ...members(200), anonymous: 404 },
    },
    {
      what: "the demo game's published Edition",
      call: (w) => ({ params: { id: String(w.demoCharacterId) }, query: "?edition=1-1" }),
      expect: all(200),
    },
    {
      what: "the demo game's published Edition, sent its ETag",
      call: async (w) => ({
        params: { id: String(w.demoCharacterId) },
        query: "?edition=1-1",
        headers: { "if-none-match": await graphEtag(w, "anonymous", w.demoCharacterId, "?edition=1-1") },
      }),
      expect: all(304),
    },
  ],
  "GET /api/auth/[...nextauth]": { exempt: "next-auth's own sign-in endpoints: public by design, rate limited" },
  "POST /api/auth/[...nextauth]": { exempt: "next-auth's own sign-in endpoints: public by design, rate limited" },
  "GET /api/teams": [{ what: "my teams", call: () => ({}), expect: { ...all(200), anonymous: 401 } }],
  "POST /api/teams": [
    { what: "start a team", call: () => ({ body: { name: "Fresh Team" } }), expect: { ...all(201), anonymous: 401 } },
  ],
  "GET /api/teams/[team]/members": [
    { what: "list members", call: (w) => ({ params: { team: w.team.slug } }), expect: members(200) },
  ],
  "PATCH /api/teams/[team]/members/[user]": [
    {
      what: "make a player a coach",
      call: (w) => ({ params: { team: w.team.slug, user: w.people.extra.id }, body: { role: "coach" } }),
      expect: ownerOnly(200),
    },
  ],
  "DELETE /api/teams/[team]/members/[user]": [
    {
      what: "remove another member",
      call: (w) => ({ params: { team: w.team.slug, user: w.people.extra.id } }),
      expect: ownerOnly(204),
    },
  ],
  "GET /api/teams/[team]/invites": [
    { what: "list invites", call: (w) => ({ params: { team: w.team.slug } }), expect: atLeastCoach(200) },
  ],
  "POST /api/teams/[team]/invites": [
    {
      what: "invite a player",
      call: (w) => ({
        params: { team: w.team.slug },
        body: { email: `new-${w.team.slug}@example.test`, role: "player" },
      }),
      expect: atLeastCoach(201),
    },
  ],
  "DELETE /api/teams/[team]/invites/[invite]": [
    {
      what: "withdraw an invite",
      call: (w) => ({ params: { team: w.team.slug, invite: String(w.pending.invite.id) } }),
      expect: atLeastCoach(204),
    },
  ],
  "GET /api/teams/[team]/audit": [
    { what: "read the team log", call: (w) => ({ params: { team: w.team.slug } }), expect: atLeastCoach(200) },
  ],
  "POST /api/teams/[team]/games": [
    {
      what: "make a game for the team",
      call: (w) => ({ params: { team: w.team.slug }, body: { name: "Matrix Rumble" } }),
      expect: atLeastCoach(201),
    },
  ],
  "POST /api/games/[game]/characters": [
    {
      what: "add a character to the team's game",
      call: (w) => ({ params: { game: w.teamGame.slug }, body: { name: "Player Glimmerdusk" } }),
      expect: atLeastCoach(201),
    },
    {
      what: "add a character to the demo game (read-only)",
      call: () => ({ params: { game: "vesper-circuit" }, body: { name: "Player Glimmerdusk" } }),
      expect: { ...all(403), anonymous: 401 },
    },
  ],
  "POST /api/games/[game]/editions": [
    {
      what: "start the next Edition",
      call: (w) => ({ params: { game: w.teamGame.slug }, body: { name: "0.2" } }),
      expect: atLeastCoach(201),
    },
    {
      what: "start an Edition of the demo game (read-only)",
      call: () => ({ params: { game: "vesper-circuit" }, body: { name: "9.9" } }),
      expect: { ...all(403), anonymous: 401 },
    },
  ],
  "POST /api/games/[game]/editions/[edition]/publish": [
    {
      what: "publish a draft",
      call: async (w) => ({ params: { game: w.teamGame.slug, edition: await draftOf(w) } }),
      expect: atLeastCoach(200),
    },
  ],
  "POST /api/games/[game]/editions/[edition]/characters/[character]/stances": [
    {
      what: "add a stance in a draft",
      call: async (w) => ({
        params: { game: w.teamGame.slug, edition: await draftOf(w), character: "sparring-dummy" },
        body: { key: "guard", name: "Low Guard", abbreviation: "LG" },
      }),
      expect: atLeastCoach(201),
    },
  ],
  "POST /api/games/[game]/editions/[edition]/characters/[character]/import": [
    {
      what: "preview a character file against a draft",
      call: async (w) => ({
        params: { game: w.teamGame.slug, edition: await draftOf(w), character: "sparring-dummy" },
        query: "?preview=1",
        form: characterForm("sparring-dummy"),
      }),
      expect: atLeastCoach(200),
    },
    {
      what: "import a character file into a draft",
      call: async (w) => ({
        params: { game: w.teamGame.slug, edition: await draftOf(w), character: "sparring-dummy" },
        form: characterForm("sparring-dummy"),
      }),
      expect: atLeastCoach(200),
    },
    {
      what: "import into the published Edition",
      call: (w) => ({
        params: { game: w.teamGame.slug, edition: "0-1", character: "sparring-dummy" },
        form: characterForm("sparring-dummy"),
      }),
      expect: atLeastCoach(409),
    },
    {
      what: "import into the demo game (read-only)",
      call: () => ({
        params: { game: "vesper-circuit", edition: "1-1", character: "tarrow" },
        form: characterForm("tarrow", "Tarrow"),
      }),
      expect: { ...all(403), anonymous: 401 },
    },
  ],
  "GET /api/games/[game]/editions/[edition]/characters/[character]/export": [
    // Signed out, a team's game is as unknown as to an outsider.
    {
      what: "download a character of the team's game",
      call: (w) => ({
        params: { game: w.teamGame.slug, edition: "0-1", character: "sparring-dummy" },
        query: "?format=json",
      }),
      expect: { ...members(200), anonymous: 404 },
    },
    {
      what: "download a character of the demo game",
      call: () => ({ params: { game: "vesper-circuit", edition: "1-1", character: "tarrow" } }),
      expect: all(200),
    },
  ],
  "GET /api/games/[game]/editions/[edition]/export": [
    {
      what: "download an Edition of the team's game",
      call: (w) => ({ params: { game: w.teamGame.slug, edition: "0-1" } }),
      expect: { ...members(200), anonymous: 404 },
    },
    {
      what: "download an Edition of the demo game",
      call: () => ({ params: { game: "vesper-circuit", edition: "1-1" }, query: "?format=json" }),
      expect: all(200),
    },
  ],
  "PATCH /api/games/[game]/editions/[edition]/characters/[character]/moves/[move]": [
    {
      what: "save a move in a draft",
      call: async (w) => ({
        params: { game: w.teamGame.slug, edition: await draftOf(w), character: "sparring-dummy", move: "1" },
        body: { version: 1, changes: { onBlock: -6 } },
      }),
      expect: atLeastCoach(200),
    },
  ],
  "GET /api/games/[game]/editions/[edition]/characters/[character]/moves/[move]": [
    {
      what: "open a move of a draft to edit it",
      call: async (w) => ({
        params: { game: w.teamGame.slug, edition: await draftOf(w), character: "sparring-dummy", move: "1" },
      }),
      expect: atLeastCoach(200),
    },
  ],
  "DELETE /api/games/[game]/editions/[edition]/characters/[character]/moves/[move]": [
    {
      what: "delete a move of a draft with its follow-up",
      call: async (w) => ({
        params: { game: w.teamGame.slug, edition: await draftOf(w), character: "sparring-dummy", move: "1" },
        query: "?version=1",
      }),
      expect: atLeastCoach(200),
    },
  ],
  "POST /api/games/[game]/editions/[edition]/characters/[character]/moves": [
    {
      what: "add a follow-up in a draft",
      call: async (w) => ({
        params: { game: w.teamGame.slug, edition: await draftOf(w), character: "sparring-dummy" },
        body: {
          move: { input: "1,1,1", name: "Third Poke", level: "mid", damage: 8, onBlock: -9, onHit: 2, onCounterHit: 2 },
          via: { kind: "follow", from: "1,1", input: ",1", gapOnBlock: 3, comboOnHit: true, comboOnCounterHit: true },
        },
      }),
      expect: atLeastCoach(201),
    },
  ],
  "POST /api/games/[game]/editions/[edition]/characters/[character]/edges": [
    {
      what: "link two moves of a draft",
      call: async (w) => ({
        params: { game: w.teamGame.slug, edition: await draftOf(w), character: "sparring-dummy" },
        body: newLink(),
      }),
      expect: atLeastCoach(201),
    },
  ],
  "GET /api/games/[game]/editions/[edition]/characters/[character]/edges/[edge]": [
    {
      what: "open a link of a draft to edit it",
      call: async (w) => ({
        params: { game: w.teamGame.slug, edition: await draftOf(w), character: "sparring-dummy", edge: "1>1,1" },
      }),
      expect: atLeastCoach(200),
    },
  ],
  "PATCH /api/games/[game]/editions/[edition]/characters/[character]/edges/[edge]": [
    {
      what: "save a link in a draft",
      call: async (w) => ({
        params: { game: w.teamGame.slug, edition: await draftOf(w), character: "sparring-dummy", edge: "1>1,1" },
        body: { version: 1, changes: { gapOnBlock: 6 } },
      }),
      expect: atLeastCoach(200),
    },
  ],
  "DELETE /api/games/[game]/editions/[edition]/characters/[character]/edges/[edge]": [
    {
      what: "delete a link of a draft",
      call: async (w) => ({
        params: { game: w.teamGame.slug, edition: await draftOf(w), character: "sparring-dummy", edge: "1>1,1" },
        query: "?version=1",
      }),
      expect: atLeastCoach(204),
    },
  ],
  "POST /api/permalinks": [
    {
      what: "share a view with the team",
      call: (w) => ({
        body: { teamId: w.team.id, characterId: w.demoCharacterId, edition: "1-1", view: VIEW, visibility: "link" },
      }),
      expect: { anonymous: 401, viewer: 403, player: 201, coach: 201, owner: 201, outsider: 404 },
    },
    {
      what: "share a board of the team",
      call: (w) => ({ body: { kind: "board", teamId: w.team.id, view: { board: w.board.id }, visibility: "team" } }),
      expect: { anonymous: 401, viewer: 403, player: 201, coach: 201, owner: 201, outsider: 404 },
    },
    {
      what: "share a stance sheet of the demo game",
      call: (w) => ({
        body: newStanceLink(w, "link"),
      }),
      expect: { anonymous: 401, viewer: 403, player: 201, coach: 201, owner: 201, outsider: 404 },
    },
  ],
  "GET /api/teams/[team]/boards": [
    { what: "list the team's boards", call: (w) => ({ params: { team: w.team.slug } }), expect: members(200) },
  ],
  "POST /api/teams/[team]/boards": [
    {
      what: "make a board on the team's game",
      call: (w) => ({ params: { team: w.team.slug }, body: newBoard(w) }),
      expect: atLeastCoach(201),
    },
    {
      what: "make a board on the demo game",
      call: (w) => ({
        params: { team: w.team.slug },
        body: { ...newBoard(w), characterId: w.demoCharacterId, edition: "1-1", origin: null },
      }),
      expect: atLeastCoach(201),
    },
  ],
  "GET /api/teams/[team]/boards/[board]": [
    {
      what: "open a board",
      call: (w) => ({ params: { team: w.team.slug, board: String(w.board.id) } }),
      expect: members(200),
    },
  ],
  "PUT /api/teams/[team]/boards/[board]": [
    {
      what: "save a board",
      call: (w) => ({ params: { team: w.team.slug, board: String(w.board.id) }, body: boardSave() }),
      expect: atLeastCoach(200),
    },
  ],
  "DELETE /api/teams/[team]/boards/[board]": [
    {
      what: "delete a board",
      call: (w) => ({ params: { team: w.team.slug, board: String(w.board.id) }, query: "?version=1" }),
      expect: atLeastCoach(204),
    },
  ],
  "DELETE /api/permalinks/[slug]": [
    // The player made it: the creator, a coach or an owner may revoke it.
    {
      what: "revoke the player's link",
      call: (w) => ({ params: { slug: w.shared.slug } }),
      expect: { anonymous: 401, viewer: 403, player: 200, coach: 200, owner: 200, outsider: 404 },
    },
  ],
  "GET /api/teams/[team]/permalinks": [
    { what: "list the team's links", call: (w) => ({ params: { team: w.team.slug } }), expect: members(200) },
  ],
  "POST /api/invites/accept": [
    // The invite is for another address: nobody here may use it, and to them it answers as an unknown
    // invite (the invitee's own use is tested in teams.test.ts).
    {
      what: "use someone else's invite",
      call: (w) => ({ body: { token: w.pending.token } }),
      expect: { ...all(404), anonymous: 401 },
    },
  ],
};

interface ActionCase {
  what: string;
  form: (w: World) => Record<string, string>;
  expect: Expected;
}

/**
 * Every server action (exported from an `actions.ts` under src/app) × caller → the status its
 * answer stands for: 200 for `ok`, the error code's status, 303 for a redirect.
 */
const ACTIONS: Record<string, ActionCase[]> = {
  "(auth)/actions.ts signUp": [
    // Answers "check your e-mail" (a redirect) for anyone; the account waits for its address to be proven.
    {
      what: "make an account",
      form: (w) => ({ name: "New Person", email: `new-${w.team.slug}@example.test`, password: "long enough password" }),
      expect: all(303),
    },
  ],
  "(auth)/actions.ts resendConfirmation": [
    { what: "ask for a new confirmation link", form: (w) => ({ email: w.people.viewer.email }), expect: all(200) },
  ],
  "(auth)/actions.ts confirmEmail": [
    { what: "use a confirmation link that does not exist", form: () => ({ token: "no-such-token" }), expect: all(404) },
  ],
  "(auth)/actions.ts signOutEverywhere": [
    { what: "end every session", form: () => ({}), expect: { ...all(303), anonymous: 401 } },
  ],
  "(auth)/actions.ts requestPasswordReset": [
    { what: "ask for a reset link", form: (w) => ({ email: w.people.viewer.email }), expect: all(303) },
  ],
  "(auth)/actions.ts resetPassword": [
    {
      what: "use a link that does not exist",
      form: () => ({ token: "no-such-token", password: "long enough password" }),
      expect: all(404),
    },
  ],
  "(auth)/actions.ts changePassword": [
    // These people signed up by link and have no password yet: a clear 400 once signed in.
    {
      what: "change a password",
      form: () => ({ currentPassword: "whatever it was", newPassword: "long enough password" }),
      expect: { ...all(400), anonymous: 401 },
    },
  ],
};

async function statusOfAction(action: Action, form: Record<string, string>): Promise<number> {
  const data = new FormData();
  for (const [k, v] of Object.entries(form)) data.set(k, v);
  try {
    const state = await action(null, data);
    return state === null || state.ok ? 200 : ERROR_STATUS[state.code];
  } catch (error) {
    if (String((error as { digest?: string }).digest ?? "").startsWith("NEXT_REDIRECT")) return 303;
    throw error;
  }
}

describe("role matrix", () => {
  test("every route handler has a row, and every row a route", async () => {
    const found = [...(await routeHandlers()).keys()].sort();
    expect(
      found.filter((k) => !(k in MATRIX)),
      "routes with no row in MATRIX",
    ).toEqual([]);
    expect(
      Object.keys(MATRIX).filter((k) => !found.includes(k)),
      "rows for routes that do not exist",
    ).toEqual([]);
  });

  const rows = Object.entries(MATRIX).flatMap(([key, row]) =>
    "exempt" in row ? [] : row.map((c) => [key, c] as const),
  );
  test.each(rows)("%s", async (key, c) => {
    const handler = (await routeHandlers()).get(key);
    expect(handler, `${key} is not a route`).toBeDefined();
    const [method, path] = key.split(" ") as [string, string];
    const got: Partial<Expected> = {};
    const leaks: string[] = [];
    for (const actor of ACTORS) {
      // A fresh world per caller: a change one caller makes must not decide the next one's answer.
      const w = await world();
      const { params = {}, body, form, query = "", headers } = await c.call(w);
      setSession(userOf(w, actor));
      // Each call from its own address, like the actions above: no route's per-address limit decides a row.
      const from = { ...headers, "x-forwarded-for": nextAddress() };
      const request = new Request(routeUrl(path, params, query), {
        method,
        headers: body === undefined ? from : { ...from, "content-type": "application/json" },
        ...(body === undefined ? {} : { body: JSON.stringify(body) }),
        ...(form === undefined ? {} : { body: form }),
      });
      const res = await handler!(request, { params: Promise.resolve(params) });
      got[actor] = res.status;
      if (actor === "outsider" || actor === "anonymous") {
        // Nothing of the team's may reach someone outside it.
        const text = await res.text();
        for (const secret of [w.team.name, w.people.owner.email, w.people.viewer.email, w.pending.invite.email]) {
          if (text.includes(secret)) leaks.push(`${actor} saw ${secret}`);
        }
      }
    }
    expect(got, `${key}: ${c.what}`).toEqual(c.expect);
    expect(leaks).toEqual([]);
  });

  test("every server action has a row, and every row an action", async () => {
    const found = [...(await serverActions()).keys()].sort();
    expect(
      found.filter((k) => !(k in ACTIONS)),
      "server actions with no row in ACTIONS",
    ).toEqual([]);
    expect(
      Object.keys(ACTIONS).filter((k) => !found.includes(k)),
      "rows for actions that do not exist",
    ).toEqual([]);
  });

  const actionRows = Object.entries(ACTIONS).flatMap(([key, cases]) => cases.map((c) => [key, c] as const));
  test.each(actionRows)("action %s", async (key, c) => {
    const action = (await serverActions()).get(key);
    expect(action, `${key} is not a server action`).toBeDefined();
    const got: Partial<Expected> = {};
    for (const actor of ACTORS) {
      const w = await world();
      setSession(userOf(w, actor));
      got[actor] = await statusOfAction(action!, c.form(w));
    }
    expect(got, `${key}: ${c.what}`).toEqual(c.expect);
  });
});
