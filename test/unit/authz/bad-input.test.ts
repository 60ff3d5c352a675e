import { randomUUID } from "node:crypto";
import { count, eq } from "drizzle-orm";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import { POST as acceptInvite } from "@/app/api/invites/accept/route";
import { POST as createPermalink } from "@/app/api/permalinks/route";
import { POST as createBoard } from "@/app/api/teams/[team]/boards/route";
import { PUT as saveBoard } from "@/app/api/teams/[team]/boards/[board]/route";
import { POST as invite } from "@/app/api/teams/[team]/invites/route";
import { PATCH as changeRole } from "@/app/api/teams/[team]/members/[user]/route";
import { POST as createTeam } from "@/app/api/teams/route";
import { POST as createGame } from "@/app/api/teams/[team]/games/route";
import { POST as createCharacter } from "@/app/api/games/[game]/characters/route";
import { POST as startEdition } from "@/app/api/games/[game]/editions/route";
import { PATCH as saveMove } from "@/app/api/games/[game]/editions/[edition]/characters/[character]/moves/[move]/route";
import { POST as addMove } from "@/app/api/games/[game]/editions/[edition]/characters/[character]/moves/route";
import { POST as addEdge } from "@/app/api/games/[game]/editions/[edition]/characters/[character]/edges/route";
import { PATCH as saveEdge } from "@/app/api/games/[game]/editions/[edition]/characters/[character]/edges/[edge]/route";
import { setSession } from "./session-mock";
import { closeDb, getDb } from "@/server/db";
import { listMembers, listMyTeams } from "@/server/db/queries/teams";
import { auditLog, boards, characters, editions, games, invites, permalinks, users } from "@/server/db/schema";
import { boardSave, newStanceLink, newBoard, newGame, VIEW, world, type World, newLink, newFollowUp } from "./world";

vi.mock("@/server/auth", () => import("./session-mock"));
vi.mock("@/server/mail", async (original) => ({
  ...(await original<typeof import("@/server/mail")>()),
  sendMail: async () => {},
  deliverSoon: () => {},
}));

afterAll(closeDb);

type Handler = (request: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
interface BodyRoute {
  name: string;
  handler: Handler;
  params: (w: World) => Record<string, string>;
  /** A body the route accepts, so each bad one differs from it in one way. */
  good: (w: World) => Record<string, unknown>;
  /** The fields that hold text a person typed. */
  text: string[];
  /** Where a route that keeps free text keeps it: the texts stored, to find SQL- or script-looking text unchanged. */
  stored?: (w: World) => Promise<string[]>;
}

/** The names and summaries of the team's games, their characters and Editions, as stored. */
async function storedOfGames(w: World): Promise<string[]> {
  const db = getDb();
  const mine = await db.select().from(games).where(eq(games.teamId, w.team.id));
  const out = mine.flatMap((g) => [g.name, g.summary ?? ""]);
  for (const g of mine) {
    out.push(
      ...(await db.select().from(characters).where(eq(characters.gameId, g.id))).flatMap((c) => [
        c.name,
        c.summary ?? "",
      ]),
    );
    out.push(...(await db.select().from(editions).where(eq(editions.gameId, g.id))).map((e) => e.name));
  }
  return out;
}

/** The titles of the team's boards, as stored. */
async function storedBoardTitles(w: World): Promise<string[]> {
  return (await getDb().select({ title: boards.title }).from(boards).where(eq(boards.teamId, w.team.id))).map(
    (b) => b.title,
  );
}

// Every route that takes a JSON body. Each is sent broken JSON, an oversized body, wrong types,
// and text that looks like SQL or a script. Every route and every server action (each has a row
// there, and a new one without a row fails) is also fuzzed in fuzz.test.ts: no 500, and a
// refusal writes nothing.
const ROUTES: BodyRoute[] = [
  {
    name: "POST /api/teams",
    handler: createTeam as Handler,
    params: () => ({}),
    good: () => ({ name: "Night Shift" }),
    text: ["name"],
    stored: async (w) => (await listMyTeams({ userId: w.people.owner.id })).map((t) => t.name),
  },
  {
    name: "PATCH /api/teams/[team]/members/[user]",
    handler: changeRole as Handler,
    params: (w) => ({ team: w.team.slug, user: w.people.extra.id }),
    good: () => ({ role: "coach" }),
    text: ["role"],
  },
  {
    name: "POST /api/teams/[team]/invites",
    handler: invite as Handler,
    params: (w) => ({ team: w.team.slug }),
    good: (w) => ({ email: `someone-${w.team.slug}@example.test`, role: "viewer" }),
    text: ["email", "role"],
  },
  {
    name: "POST /api/invites/accept",
    handler: acceptInvite as Handler,
    params: () => ({}),
    good: (w) => ({ token: w.pending.token }),
    text: ["token"],
  },
  {
    name: "POST /api/permalinks",
    handler: createPermalink as Handler,
    params: () => ({}),
    good: (w) => ({
      teamId: w.team.id,
      characterId: w.demoCharacterId,
      edition: "1-1",
      view: VIEW,
      visibility: "link",
    }),
    text: ["edition", "visibility"],
  },
  {
    name: "POST /api/permalinks (a board)",
    handler: createPermalink as Handler,
    params: () => ({}),
    good: (w) => ({ kind: "board", teamId: w.team.id, view: { board: w.board.id }, visibility: "link" }),
    text: ["kind", "visibility"],
  },
  {
    name: "POST /api/permalinks (a stance sheet)",
    handler: createPermalink as Handler,
    params: () => ({}),
    good: (w) => newStanceLink(w, "link"),
    text: ["kind", "edition", "visibility"],
  },
  {
    name: "POST /api/teams/[team]/boards",
    handler: createBoard as Handler,
    params: (w) => ({ team: w.team.slug }),
    good: (w) => ({ ...newBoard(w), opponentId: w.teamCharacterId }),
    text: ["title", "edition"],
    stored: storedBoardTitles,
  },
  {
    name: "PUT /api/teams/[team]/boards/[board]",
    handler: saveBoard as Handler,
    params: (w) => ({ team: w.team.slug, board: String(w.board.id) }),
    good: boardSave,
    text: ["title"],
    stored: storedBoardTitles,
  },
  {
    name: "POST /api/teams/[team]/games",
    handler: createGame as Handler,
    params: (w) => ({ team: w.team.slug }),
    good: () => newGame("Night Circuit"),
    text: ["name", "edition", "rangeKind", "rangeUnit"],
    stored: storedOfGames,
  },
  {
    name: "POST /api/games/[game]/characters",
    handler: createCharacter as Handler,
    params: (w) => ({ game: w.teamGame.slug }),
    good: () => ({ name: "Player Glimmerdusk", summary: "Keeps you out." }),
    text: ["name", "summary"],
    stored: storedOfGames,
  },
  {
    name: "POST /api/games/[game]/editions",
    handler: startEdition as Handler,
    params: (w) => ({ game: w.teamGame.slug }),
    good: () => ({ name: "0.2", releasedOn: "2026-12-01" }),
    text: ["name", "releasedOn"],
    stored: storedOfGames,
  },
  {
    name: "PATCH /api/games/[game]/editions/[edition]/characters/[character]/moves/[move]",
    handler: saveMove as Handler,
    params: (w) => ({ game: w.teamGame.slug, edition: "0-1", character: "sparring-dummy", move: "1" }),
    good: () => ({ version: 1, changes: { damage: 12 } }),
    text: [],
  },
  {
    name: "POST /api/games/[game]/editions/[edition]/characters/[character]/moves",
    handler: addMove as Handler,
    params: (w) => ({ game: w.teamGame.slug, edition: "0-1", character: "sparring-dummy" }),
    good: newFollowUp,
    text: [],
  },
  {
    name: "POST /api/games/[game]/editions/[edition]/characters/[character]/edges",
    handler: addEdge as Handler,
    params: (w) => ({ game: w.teamGame.slug, edition: "0-1", character: "sparring-dummy" }),
    good: newLink,
    text: [],
  },
  {
    name: "PATCH /api/games/[game]/editions/[edition]/characters/[character]/edges/[edge]",
    handler: saveEdge as Handler,
    params: (w) => ({ game: w.teamGame.slug, edition: "0-1", character: "sparring-dummy", edge: "1>1,1" }),
    good: () => ({ version: 1, changes: { gapOnBlock: 3 } }),
    text: [],
  },
];

const SQL = "x'); DROP TABLE teams; --";
const SCRIPT = "<script>alert('frame')</script>";

async function send(route: BodyRoute, w: World, body: string, type = "application/json") {
  return route.handler(new Request("http://test/api", { method: "POST", headers: { "content-type": type }, body }), {
    params: Promise.resolve(route.params(w)),
  });
}

/** What this world's owner and team hold: other test files write to the same database at the same time. */
async function rowCounts(w: World) {
  const db = getDb();
  const inTeam = async (t: typeof invites | typeof permalinks | typeof auditLog) =>
    Number((await db.select({ n: count() }).from(t).where(eq(t.teamId, w.team.id)))[0]?.n);
  return {
    teams: (await listMyTeams({ userId: w.people.owner.id })).length,
    invites: await inTeam(invites),
    permalinks: await inTeam(permalinks),
    audit: await inTeam(auditLog),
    boards: (await db.select().from(boards).where(eq(boards.teamId, w.team.id))).map((b) =>
      JSON.stringify([b.id, b.version, b.title, b.document, b.updatedBy]),
    ),
    members: (await listMembers({ teamId: w.team.id })).map((m) => `${m.userId}:${m.role}`).sort(),
  };
}

describe.each(ROUTES)("$name refuses bad input with 400 and a message, and writes nothing", (route) => {
  let w: World;
  beforeEach(async () => {
    w = await world();
    setSession({ id: w.people.owner.id, email: w.people.owner.email, name: w.people.owner.name });
  });

  const refused = async (res: Response, status: number | number[] = 400) => {
    expect([status].flat()).toContain(res.status);
    const body = (await res.json()) as { error: { message: string } };
    expect(body.error.message.length).toBeGreaterThan(10);
  };

  test("malformed JSON, the wrong content type and an oversized body", async () => {
    const before = await rowCounts(w);
    await refused(await send(route, w, '{"name": "unterminated'));
    await refused(await send(route, w, JSON.stringify(route.good(w)), "text/plain"), 415);
    await refused(await send(route, w, JSON.stringify({ ...route.good(w), padding: "x".repeat(2_000_000) })), 413);
    expect(await rowCounts(w)).toEqual(before);
  });

  test("wrong types and unknown fields", async () => {
    const before = await rowCounts(w);
    for (const field of Object.keys(route.good(w))) {
      await refused(await send(route, w, JSON.stringify({ ...route.good(w), [field]: { nested: [1, 2] } })));
    }
    await refused(await send(route, w, JSON.stringify([route.good(w)])));
    await refused(await send(route, w, JSON.stringify({ ...route.good(w), isAdmin: true })));
    expect(await rowCounts(w)).toEqual(before);
  });

  test("SQL- and script-looking text is refused, or kept exactly as typed", async () => {
    for (const field of route.text) {
      for (const nasty of [SQL, SCRIPT]) {
        const fresh = await world();
        setSession({ id: fresh.people.owner.id, email: fresh.people.owner.email, name: fresh.people.owner.name });
        const res = await send(route, fresh, JSON.stringify({ ...route.good(fresh), [field]: nasty }));
        if (res.status === 201 || res.status === 200) {
          // Only a free-text field may take it, and then it comes back exactly as typed.
          expect(route.stored, `${route.name} took ${field}`).toBeDefined();
          expect(await route.stored!(fresh)).toContain(nasty);
        } else {
          // Refused by the schema (400), or read as plain text and found to match nothing (404).
          await refused(res, [400, 404]);
        }
      }
    }
    // The table the SQL-looking text names is still there.
    expect((await rowCounts(w)).teams).toBeGreaterThan(0);
  });
});

test("a refused role change leaves the member as they were", async () => {
  const w = await world();
  setSession({ id: w.people.owner.id, email: w.people.owner.email, name: w.people.owner.name });
  const route = ROUTES[1]!;
  const res = await send(route, w, JSON.stringify({ role: "admin" }));
  expect(res.status).toBe(400);
  const extra = (await listMembers({ teamId: w.team.id })).find((m) => m.userId === w.people.extra.id);
  expect(extra?.role).toBe("player");
});

test("a team name with a line break, a control or a text-direction character is refused, and no team is made", async () => {
  const w = await world();
  setSession({ id: w.people.owner.id, email: w.people.owner.email, name: w.people.owner.name });
  const before = await rowCounts(w);
  for (const name of ["Night\nShift", "Night\u0085Shift", "Night\u202EtfihS", "Night\u2066Shift", "Night\u2028Shift"]) {
    const res = await send(ROUTES[0]!, w, JSON.stringify({ name }));
    expect(res.status, JSON.stringify(name)).toBe(400);
    const body = (await res.json()) as { error: { message: string; issues: { message: string }[] } };
    expect(body.error.issues[0]?.message).toMatch(/cannot contain line breaks, control characters/);
  }
  expect(await rowCounts(w)).toEqual(before);
});

test("sign-up refuses a display name with a line break or a text-direction character, and makes no account", async () => {
  const { signUp } = await import("@/app/(auth)/actions");
  for (const name of ["Player\nQuellborn", "Player\u202EQuellborn"]) {
    const email = `name-check-${randomUUID().slice(0, 8)}@example.test`;
    const form = new FormData();
    for (const [k, v] of Object.entries({ name, email, password: "long enough password" })) form.set(k, v);
    const state = await signUp(null, form);
    expect(state).toMatchObject({ ok: false, code: "bad_request" });
    expect(state && !state.ok && state.fieldErrors?.name).toMatch(/^Your name cannot contain line breaks/);
    expect(await getDb().select().from(users).where(eq(users.email, email))).toEqual([]);
  }
});
