import { readdirSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import { ERROR_STATUS } from "@/lib/errors";
import type { ActionState } from "@/server/actions";
import type { SessionUser } from "@/server/auth";
import { setSession } from "./session-mock";
import { closeDb } from "@/server/db";
import { VIEW, world, type World } from "./world";

// Who is signed in for the call under test. Route handlers read the session only through
// @/server/auth, so the matrix sets it here; everything else (database, role checks) is real.
vi.mock("@/server/auth", () => import("./session-mock"));
// Invites would send e-mail; the matrix is about who may act, so mail is recorded, not sent.
const sent: { to: string }[] = [];
vi.mock("@/server/mail", async (original) => ({
  ...(await original<typeof import("@/server/mail")>()),
  sendMail: async (m: { to: string }) => void sent.push(m),
}));
// Server actions read the caller's address for rate limits; each call comes from its own.
let address = 0;
// Actions that start or end a session in this browser write its cookie: a jar that forgets.
vi.mock("next/headers", () => ({
  headers: async () => new Headers({ "x-forwarded-for": `198.51.100.${(address++ % 250) + 1}` }),
  cookies: async () => ({ get: () => undefined, getAll: () => [], set: () => undefined, delete: () => undefined }),
}));

afterAll(closeDb);
beforeEach(() => setSession(null));

const ACTORS = ["anonymous", "viewer", "player", "coach", "owner", "outsider"] as const;
type Actor = (typeof ACTORS)[number];
type Expected = Record<Actor, number>;

const userOf = (w: World, actor: Actor): SessionUser | null =>
  actor === "anonymous" ? null : { id: w.people[actor].id, email: w.people[actor].email, name: w.people[actor].name };

type Handler = (request: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
interface Case {
  /** What the call does, for the failure message. */
  what: string;
  call: (w: World) => { params?: Record<string, string>; body?: unknown; query?: string };
  expect: Expected;
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
      call: () => ({
        body: {
          root: "a",
          graph: {
            nodes: [
              {
                kind: "move",
                id: "a",
                input: "1",
                level: "mid",
                damage: 10,
                startup: 12,
                onBlock: -2,
                onHit: 3,
                onCounterHit: 5,
              },
            ],
            edges: [],
          },
        },
      }),
      expect: all(200),
    },
  ],
  "GET /api/characters/[id]/graph": [
    { what: "a team's game", call: (w) => ({ params: { id: String(w.teamCharacterId) } }), expect: members(200) },
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
  "POST /api/permalinks": [
    {
      what: "share a view with the team",
      call: (w) => ({
        body: { teamId: w.team.id, characterId: w.demoCharacterId, edition: "1-1", view: VIEW, visibility: "link" },
      }),
      expect: { anonymous: 401, viewer: 403, player: 201, coach: 201, owner: 201, outsider: 404 },
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
    // The invite is for another address: nobody here may use it (the invitee's own use is tested in teams.test.ts).
    {
      what: "use someone else's invite",
      call: (w) => ({ body: { token: w.pending.token } }),
      expect: { ...all(403), anonymous: 401 },
    },
  ],
};

type Action = (previous: ActionState, form: FormData) => Promise<ActionState>;
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

async function actions(): Promise<Map<string, Action>> {
  const out = new Map<string, Action>();
  for (const file of filesNamed(APP, "actions.ts")) {
    const mod = (await import(file)) as Record<string, unknown>;
    for (const [name, fn] of Object.entries(mod))
      if (typeof fn === "function") out.set(`${relative(APP, file)} ${name}`, fn as Action);
  }
  return out;
}

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

const APP = join(process.cwd(), "src/app");
const API = join(APP, "api");
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

/** Every file called `file` under `dir`. */
function filesNamed(dir: string, file: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return filesNamed(path, file);
    return name === file ? [path] : [];
  });
}

async function handlers(): Promise<Map<string, Handler>> {
  const out = new Map<string, Handler>();
  for (const file of filesNamed(API, "route.ts")) {
    const route = `/api/${relative(API, file).replace(/\/?route\.ts$/, "")}`.replace(/\/$/, "");
    const mod = (await import(file)) as Partial<Record<(typeof METHODS)[number], Handler>>;
    for (const m of METHODS) if (typeof mod[m] === "function") out.set(`${m} ${route}`, mod[m]);
  }
  return out;
}

describe("role matrix", () => {
  test("every route handler has a row, and every row a route", async () => {
    const found = [...(await handlers()).keys()].sort();
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
    const handler = (await handlers()).get(key);
    expect(handler, `${key} is not a route`).toBeDefined();
    const [method, path] = key.split(" ") as [string, string];
    const got: Partial<Expected> = {};
    const leaks: string[] = [];
    for (const actor of ACTORS) {
      // A fresh world per caller: a change one caller makes must not decide the next one's answer.
      const w = await world();
      const { params = {}, body, query = "" } = c.call(w);
      setSession(userOf(w, actor));
      const url = `http://test${path.replace(/\[(\.\.\.)?(\w+)\]/g, (_, __, name: string) => encodeURIComponent(params[name] ?? ""))}${query}`;
      const request = new Request(url, {
        method,
        ...(body === undefined ? {} : { body: JSON.stringify(body), headers: { "content-type": "application/json" } }),
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
    const found = [...(await actions()).keys()].sort();
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
    const action = (await actions()).get(key);
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
