import { readdirSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import { AppError } from "@/lib/errors";
import type { Role } from "@/lib/roles";
import type { SessionUser } from "@/server/auth";
import { closeDb, getDb } from "@/server/db";
import { getCharacterBySlug, getGameBySlug } from "@/server/db/queries/games";
import { createInvite } from "@/server/db/queries/invites";
import { createPermalink } from "@/server/db/queries/permalinks";
import { createTeam } from "@/server/db/queries/teams";
import { characters, editions, games, memberships } from "@/server/db/schema";
import { makeUser } from "../teams/fixtures";

// Who is signed in for the call under test. Route handlers read the session only through
// @/server/auth, so the matrix sets it here; everything else (database, role checks) is real.
let current: SessionUser | null = null;
vi.mock("@/server/auth", () => ({
  auth: async () => current,
  requireUser: async () => {
    if (!current) throw new AppError("unauthorized", "Sign in to do this.");
    return current;
  },
}));
// Invites would send e-mail; the matrix is about who may act, so mail is recorded, not sent.
const sent: { to: string }[] = [];
vi.mock("@/server/mail", () => ({ sendMail: async (m: { to: string }) => void sent.push(m) }));

afterAll(closeDb);
beforeEach(() => {
  current = null;
});

const ACTORS = ["anonymous", "viewer", "player", "coach", "owner", "outsider"] as const;
type Actor = (typeof ACTORS)[number];
type Expected = Record<Actor, number>;

/** One team with a member of each role, another team owned by the outsider, and what the routes act on. */
async function world() {
  const people = {
    owner: await makeUser("owner"),
    coach: await makeUser("coach"),
    player: await makeUser("player"),
    viewer: await makeUser("viewer"),
    outsider: await makeUser("outsider"),
    extra: await makeUser("extra"),
  };
  const team = await createTeam({ name: `Matrix ${people.owner.id.slice(0, 6)}`, ownerId: people.owner.id });
  const roles: [keyof typeof people, Role][] = [["coach", "coach"], ["player", "player"], ["viewer", "viewer"], ["extra", "player"]];
  await getDb().insert(memberships).values(roles.map(([who, role]) => ({ teamId: team.id, userId: people[who].id, role })));
  const other = await createTeam({ name: `Elsewhere ${people.outsider.id.slice(0, 6)}`, ownerId: people.outsider.id });
  const pending = await createInvite({ teamId: team.id, invitedBy: people.owner.id, inviterRole: "owner", email: `invitee-${people.owner.id.slice(0, 8)}@example.test`, role: "player" });
  // A game of the team's own, with one character and one Edition.
  const [game] = await getDb().insert(games).values({ slug: `team-game-${people.owner.id.slice(0, 8)}`, name: "Team Game", teamId: team.id }).$returningId();
  await getDb().insert(editions).values({ gameId: game!.id, slug: "0-1", name: "0.1", releasedOn: new Date("2026-10-01") });
  const [character] = await getDb().insert(characters).values({ gameId: game!.id, slug: "sparring-dummy", name: "Sparring Dummy" }).$returningId();
  // A link the player shared from the public demo game.
  const demo = await getGameBySlug({ slug: "vesper-circuit" });
  const tarrow = demo && (await getCharacterBySlug({ gameId: demo.id, slug: "tarrow" }));
  if (!tarrow) throw new Error("the demo data is not in the test database");
  const shared = await createPermalink({ teamId: team.id, createdBy: people.player.id, characterId: tarrow.id, editionSlug: "1-1", view: VIEW, visibility: "team" });
  return { people, team, other, pending, teamCharacterId: character!.id, demoCharacterId: tarrow.id, shared };
}

const VIEW = { root: "2", path: null, options: { maxDepth: 8, maxStanceVisits: 1, fastest: 10 }, opponent: null };
type World = Awaited<ReturnType<typeof world>>;

const userOf = (w: World, actor: Actor): SessionUser | null => (actor === "anonymous" ? null : { id: w.people[actor].id, email: w.people[actor].email, name: w.people[actor].name });

type Handler = (request: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
interface Case {
  /** What the call does, for the failure message. */
  what: string;
  call: (w: World) => { params?: Record<string, string>; body?: unknown; query?: string };
  expect: Expected;
}

const all = (status: number): Expected => ({ anonymous: status, viewer: status, player: status, coach: status, owner: status, outsider: status });
const members = (ok: number): Expected => ({ anonymous: 401, viewer: ok, player: ok, coach: ok, owner: ok, outsider: 404 });
const atLeastCoach = (ok: number): Expected => ({ anonymous: 401, viewer: 403, player: 403, coach: ok, owner: ok, outsider: 404 });
const ownerOnly = (ok: number): Expected => ({ anonymous: 401, viewer: 403, player: 403, coach: 403, owner: ok, outsider: 404 });

/**
 * The one table: every route handler (file under src/app/api, and method) × every kind of
 * caller → the status it must answer. A route with no row fails the test below.
 */
const MATRIX: Record<string, Case[] | { exempt: string }> = {
  "GET /api/health": [{ what: "health", call: () => ({}), expect: all(200) }],
  "POST /api/paths": [
    {
      what: "explore a posted graph",
      call: () => ({ body: { root: "a", graph: { nodes: [{ kind: "move", id: "a", input: "1", level: "mid", damage: 10, startup: 12, onBlock: -2, onHit: 3, onCounterHit: 5 }], edges: [] } } }),
      expect: all(200),
    },
  ],
  "GET /api/characters/[id]/graph": [
    { what: "a team's game", call: (w) => ({ params: { id: String(w.teamCharacterId) } }), expect: members(200) },
  ],
  "GET /api/auth/[...nextauth]": { exempt: "next-auth's own sign-in endpoints: public by design, rate limited" },
  "POST /api/auth/[...nextauth]": { exempt: "next-auth's own sign-in endpoints: public by design, rate limited" },
  "GET /api/teams": [{ what: "my teams", call: () => ({}), expect: { ...all(200), anonymous: 401 } }],
  "POST /api/teams": [{ what: "start a team", call: () => ({ body: { name: "Fresh Team" } }), expect: { ...all(201), anonymous: 401 } }],
  "GET /api/teams/[team]/members": [{ what: "list members", call: (w) => ({ params: { team: w.team.slug } }), expect: members(200) }],
  "PATCH /api/teams/[team]/members/[user]": [
    { what: "make a player a coach", call: (w) => ({ params: { team: w.team.slug, user: w.people.extra.id }, body: { role: "coach" } }), expect: ownerOnly(200) },
  ],
  "DELETE /api/teams/[team]/members/[user]": [
    { what: "remove another member", call: (w) => ({ params: { team: w.team.slug, user: w.people.extra.id } }), expect: ownerOnly(204) },
  ],
  "GET /api/teams/[team]/invites": [{ what: "list invites", call: (w) => ({ params: { team: w.team.slug } }), expect: atLeastCoach(200) }],
  "POST /api/teams/[team]/invites": [
    { what: "invite a player", call: (w) => ({ params: { team: w.team.slug }, body: { email: `new-${w.team.slug}@example.test`, role: "player" } }), expect: atLeastCoach(201) },
  ],
  "DELETE /api/teams/[team]/invites/[invite]": [
    { what: "withdraw an invite", call: (w) => ({ params: { team: w.team.slug, invite: String(w.pending.invite.id) } }), expect: atLeastCoach(204) },
  ],
  "GET /api/teams/[team]/audit": [{ what: "read the team log", call: (w) => ({ params: { team: w.team.slug } }), expect: atLeastCoach(200) }],
  "POST /api/permalinks": [
    {
      what: "share a view with the team",
      call: (w) => ({ body: { teamId: w.team.id, characterId: w.demoCharacterId, edition: "1-1", view: VIEW, visibility: "link" } }),
      expect: { anonymous: 401, viewer: 403, player: 201, coach: 201, owner: 201, outsider: 404 },
    },
  ],
  "DELETE /api/permalinks/[slug]": [
    // The player made it: the creator, a coach or an owner may revoke it.
    { what: "revoke the player's link", call: (w) => ({ params: { slug: w.shared.slug } }), expect: { anonymous: 401, viewer: 403, player: 200, coach: 200, owner: 200, outsider: 404 } },
  ],
  "GET /api/teams/[team]/permalinks": [{ what: "list the team's links", call: (w) => ({ params: { team: w.team.slug } }), expect: members(200) }],
  "POST /api/invites/accept": [
    // The invite is for another address: nobody here may use it (the invitee's own use is tested in teams.test.ts).
    { what: "use someone else's invite", call: (w) => ({ body: { token: w.pending.token } }), expect: { ...all(403), anonymous: 401 } },
  ],
};

const API = join(process.cwd(), "src/app/api");
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return routeFiles(path);
    return name === "route.ts" ? [path] : [];
  });
}

async function handlers(): Promise<Map<string, Handler>> {
  const out = new Map<string, Handler>();
  for (const file of routeFiles(API)) {
    const route = `/api/${relative(API, file).replace(/\/?route\.ts$/, "")}`.replace(/\/$/, "");
    const mod = (await import(file)) as Partial<Record<(typeof METHODS)[number], Handler>>;
    for (const m of METHODS) if (typeof mod[m] === "function") out.set(`${m} ${route}`, mod[m]);
  }
  return out;
}

describe("role matrix", () => {
  test("every route handler has a row, and every row a route", async () => {
    const found = [...(await handlers()).keys()].sort();
    expect(found.filter((k) => !(k in MATRIX)), "routes with no row in MATRIX").toEqual([]);
    expect(Object.keys(MATRIX).filter((k) => !found.includes(k)), "rows for routes that do not exist").toEqual([]);
  });

  const rows = Object.entries(MATRIX).flatMap(([key, row]) => ("exempt" in row ? [] : row.map((c) => [key, c] as const)));
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
      current = userOf(w, actor);
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
});
