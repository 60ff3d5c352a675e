import { and, asc, eq, like } from "drizzle-orm";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import { GET as listRoute, POST as createRoute } from "@/app/api/teams/[team]/boards/route";
import { DELETE as deleteRoute, GET as readRoute, PUT as saveRoute } from "@/app/api/teams/[team]/boards/[board]/route";
import { POST as createPermalinkRoute } from "@/app/api/permalinks/route";
import { AppError, VersionConflict } from "@/lib/errors";
import type { BoardDto, BoardSummaryDto, PermalinkDto } from "@/lib/dto";
import { closeDb, getDb } from "@/server/db";
import { createBoard } from "@/server/db/queries/boards";
import { loadSharedView, revokePermalink } from "@/server/db/queries/permalinks";
import { auditLog, boards } from "@/server/db/schema";
import { setSession } from "../authz/session-mock";
import { boardDocument, boardSave, draftOf, newBoard, world, type World } from "../authz/world";

// Mix-up boards saved per team: the routes with the real database, the session set by the mock.
vi.mock("@/server/auth", () => import("../authz/session-mock"));

afterAll(closeDb);
beforeEach(() => setSession(null));

type Who = "owner" | "coach" | "player" | "viewer" | "outsider";
const as = (w: World, who: Who) => {
  const p = w.people[who];
  setSession({ id: p.id, email: p.email, name: p.name });
};

const json = (method: string, body: unknown): RequestInit => ({
  method,
  headers: { "content-type": "application/json" },
  body: JSON.stringify(body),
});
const teamCtx = (w: World, team = w.team.slug) => ({ params: Promise.resolve({ team }) });
const boardCtx = (w: World, board: number | string, team = w.team.slug) => ({
  params: Promise.resolve({ team, board: String(board) }),
});

const create = (w: World, body: unknown) => createRoute(new Request("http://test/api", json("POST", body)), teamCtx(w));
const list = (w: World) => listRoute(new Request("http://test/api"), teamCtx(w));
const read = (w: World, id: number | string, team?: string) =>
  readRoute(new Request("http://test/api"), boardCtx(w, id, team));
const save = (w: World, id: number, body: unknown) =>
  saveRoute(new Request("http://test/api", json("PUT", body)), boardCtx(w, id));
const remove = (w: World, id: number, version: number) =>
  deleteRoute(new Request(`http://test/api?version=${version}`, { method: "DELETE" }), boardCtx(w, id));
const share = (w: World, body: unknown) => createPermalinkRoute(new Request("http://test/api", json("POST", body)));

const errorOf = async (res: Response) =>
  ((await res.json()) as { error: { code: string; message: string; current?: unknown } }).error;

/** The team's board log entries, oldest first. */
async function boardLog(w: World) {
  const rows = await getDb()
    .select({ action: auditLog.action, actorId: auditLog.actorId, detail: auditLog.detail })
    .from(auditLog)
    .where(and(eq(auditLog.teamId, w.team.id), like(auditLog.action, "board.%")))
    .orderBy(asc(auditLog.id));
  return rows;
}

/** Every board row of the team, as stored: "nothing was written" compares these. */
const storedBoards = async (w: World) =>
  getDb().select().from(boards).where(eq(boards.teamId, w.team.id)).orderBy(asc(boards.id));

describe("a team's boards", () => {
  test("a coach makes a board: 201 with the board at version 1, and the log says so", async () => {
    const w = await world();
    as(w, "coach");
    const res = await create(w, { ...newBoard(w), opponentId: w.teamCharacterId });
    expect(res.status).toBe(201);
    const { board } = (await res.json()) as { board: BoardDto };
    expect(board).toEqual({
      id: expect.any(Number),
      title: "Pressure after the poke",
      version: 1,
      game: { slug: w.teamGame.slug, name: "Team Game" },
      character: { id: w.teamCharacterId, slug: "sparring-dummy", name: "Sparring Dummy" },
      edition: { slug: "0-1", name: "0.1", status: "published" },
      opponent: { id: w.teamCharacterId, slug: "sparring-dummy", name: "Sparring Dummy" },
      updatedAt: expect.stringMatching(/^\d{4}-\d\d-\d\dT/),
      updatedBy: { id: w.people.coach.id, name: w.people.coach.name },
      team: { slug: w.team.slug, name: w.team.name },
      origin: { root: "1", path: null },
      document: boardDocument(),
    });
    // The world's own board was made first: the log has its entry, then this one.
    expect((await boardLog(w)).at(-1)).toEqual({
      action: "board.created",
      actorId: w.people.coach.id,
      detail: { board: board.id, title: "Pressure after the poke", version: 1 },
    });
  });

  test("the list has every board of the team, the last saved first, and nothing of the document", async () => {
    const w = await world();
    as(w, "coach");
    const second = ((await (await create(w, newBoard(w))).json()) as { board: BoardDto }).board;
    // The world's board is older; saving it puts it first.
    expect((await save(w, w.board.id, boardSave())).status).toBe(200);
    as(w, "viewer");
    const res = await list(w);
    expect(res.status).toBe(200);
    const { boards: listed } = (await res.json()) as { boards: BoardSummaryDto[] };
    expect(listed.map((b) => [b.id, b.title, b.version])).toEqual([
      [w.board.id, "Pressure, second look", 2],
      [second.id, "Pressure after the poke", 1],
    ]);
    expect(listed[0]).not.toHaveProperty("document");
    expect(listed[0]!.updatedBy).toEqual({ id: w.people.coach.id, name: w.people.coach.name });
  });

  test("a viewer reads a board as its editor opens it", async () => {
    const w = await world();
    as(w, "viewer");
    const res = await read(w, w.board.id);
    expect(res.status).toBe(200);
    expect(((await res.json()) as { board: BoardDto }).board).toEqual(w.board);
  });

  test("another team's board answers exactly like a board that does not exist", async () => {
    const w = await world();
    const mine = await world();
    as(mine, "owner");
    const theirs = await read(mine, w.board.id);
    const none = await read(mine, 3_999_999_999);
    expect(theirs.status).toBe(404);
    expect(await theirs.text()).toBe(await none.text());
  });

  test("a save based on the version read: the next version, and the log", async () => {
    const w = await world();
    as(w, "owner");
    const document = boardDocument();
    document.situations[1]!.cells[0]![1]!.override = 9;
    const res = await save(w, w.board.id, { version: 1, title: "Retitled", document });
    expect(res.status).toBe(200);
    const { board } = (await res.json()) as { board: BoardDto };
    expect(board).toMatchObject({ id: w.board.id, version: 2, title: "Retitled", document });
    expect(board.updatedBy?.id).toBe(w.people.owner.id);
    expect((await boardLog(w)).at(-1)).toEqual({
      action: "board.saved",
      actorId: w.people.owner.id,
      detail: { board: w.board.id, title: "Retitled", version: 2 },
    });
  });

  test("a stale save gets 409 with the board as it is now, and writes nothing", async () => {
    const w = await world();
    as(w, "coach");
    const first = ((await (await save(w, w.board.id, boardSave())).json()) as { board: BoardDto }).board;
    const before = { rows: await storedBoards(w), log: await boardLog(w) };

    as(w, "owner");
    const stale = await save(w, w.board.id, { ...boardSave(), title: "Mine instead" });
    expect(stale.status).toBe(409);
    const body: unknown = await stale.clone().json();
    const error = await errorOf(stale);
    expect(error.code).toBe("conflict");
    expect(error.message).toMatch(/Someone saved this board after you opened it/);
    expect(error.current).toEqual(first);
    // The client's fetcher turns it back into a VersionConflict that carries the board.
    const thrown = AppError.fromResponseBody(body, 409);
    expect(thrown).toBeInstanceOf(VersionConflict);
    expect((thrown as VersionConflict).current).toEqual(first);

    expect({ rows: await storedBoards(w), log: await boardLog(w) }).toEqual(before);
  });

  test("a delete based on an old version gets 409 and deletes nothing; on the current one, the board is gone", async () => {
    const w = await world();
    as(w, "coach");
    await save(w, w.board.id, boardSave());
    const before = { rows: await storedBoards(w), log: await boardLog(w) };
    const stale = await remove(w, w.board.id, 1);
    expect(stale.status).toBe(409);
    expect(((await errorOf(stale)).current as BoardDto).version).toBe(2);
    expect({ rows: await storedBoards(w), log: await boardLog(w) }).toEqual(before);

    expect((await remove(w, w.board.id, 2)).status).toBe(204);
    expect((await read(w, w.board.id)).status).toBe(404);
    expect(await storedBoards(w)).toEqual([]);
    expect((await boardLog(w)).at(-1)).toEqual({
      action: "board.deleted",
      actorId: w.people.coach.id,
      detail: { board: w.board.id, title: "Pressure, second look", version: 2 },
    });
  });

  test("a player or a viewer may read but not make, save or delete: 403, nothing written", async () => {
    const w = await world();
    const before = { rows: await storedBoards(w), log: await boardLog(w) };
    for (const who of ["player", "viewer"] as const) {
      as(w, who);
      expect((await read(w, w.board.id)).status).toBe(200);
      const saved = await save(w, w.board.id, boardSave());
      expect(saved.status).toBe(403);
      expect((await errorOf(saved)).message).toMatch(/coach/);
      expect((await create(w, newBoard(w))).status).toBe(403);
      expect((await remove(w, w.board.id, 1)).status).toBe(403);
    }
    expect({ rows: await storedBoards(w), log: await boardLog(w) }).toEqual(before);
  });

  test("a board may be made on a draft Edition", async () => {
    const w = await world();
    const draft = await draftOf(w);
    as(w, "coach");
    const res = await create(w, { ...newBoard(w), edition: draft });
    expect(res.status).toBe(201);
    expect(((await res.json()) as { board: BoardDto }).board.edition).toMatchObject({ slug: draft, status: "draft" });
  });
});

describe("what a board may hold", () => {
  /** Sends a document both ways (new board, save) and gives the two refusals' messages; nothing may be written. */
  async function refusals(w: World, document: unknown) {
    as(w, "coach");
    const before = { rows: await storedBoards(w), log: await boardLog(w) };
    const made = await create(w, { ...newBoard(w), document });
    const saved = await save(w, w.board.id, { ...boardSave(), document });
    expect([made.status, saved.status]).toEqual([400, 400]);
    expect({ rows: await storedBoards(w), log: await boardLog(w) }).toEqual(before);
    return [(await errorOf(made)).message, (await errorOf(saved)).message];
  }

  test("a ragged matrix is refused with a message naming the situation", async () => {
    const w = await world();
    const document = boardDocument();
    document.situations[0]!.cells[1]!.pop();
    for (const message of await refusals(w, document))
      expect(message).toMatch(/Situation "after-poke" needs 2 x 2 cells/);
  });

  test("a cell leading to a situation the board does not have is refused, naming it", async () => {
    const w = await world();
    const document = boardDocument();
    document.situations[0]!.cells[1]![1]!.next = "no-such-spot";
    for (const message of await refusals(w, document))
      expect(message).toMatch(
        /A cell of "after-poke" leads to "no-such-spot", which is not one of the board's situations/,
      );
  });

  test("a cycle of situations is refused with the engine's message naming the situations on it", async () => {
    const w = await world();
    const document = boardDocument();
    document.situations[1]!.cells[0]![1]!.next = "after-poke";
    for (const message of await refusals(w, document))
      expect(message).toMatch(/"after-poke" → "scramble" → "after-poke" lead back to each other/);
  });

  test("a root that is not a situation, and two situations with one id, are refused, naming them", async () => {
    const w = await world();
    const rootless = { ...boardDocument(), root: "elsewhere" };
    for (const message of await refusals(w, rootless)) expect(message).toMatch(/starts at "elsewhere"/);
    const twice = boardDocument();
    twice.situations[1]!.id = "after-poke";
    for (const message of await refusals(w, twice)) expect(message).toMatch(/Two situations have the id "after-poke"/);
  });

  test("a title of two lines, or none, is refused", async () => {
    const w = await world();
    as(w, "coach");
    for (const title of ["Two\nlines", "   "]) {
      const res = await create(w, { ...newBoard(w), title });
      expect(res.status).toBe(400);
      expect((await errorOf(res)).message).toMatch(/title/);
    }
  });
});

describe("whose characters a board may use", () => {
  test("a board on another team's private game is refused like a character that does not exist", async () => {
    const w = await world();
    const other = await world();
    as(w, "coach");
    const before = { rows: await storedBoards(w), log: await boardLog(w) };
    const theirs = await create(w, { ...newBoard(w), characterId: other.teamCharacterId });
    const none = await create(w, { ...newBoard(w), characterId: 3_999_999_999 });
    expect(theirs.status).toBe(404);
    expect((await errorOf(theirs)).message).toBe(`There is no character ${other.teamCharacterId}.`);
    expect((await errorOf(none)).message).toBe("There is no character 3999999999.");
    // As the opponent: refused as not in the game, like any character of another game.
    const opponent = await create(w, { ...newBoard(w), opponentId: other.teamCharacterId });
    expect(opponent.status).toBe(400);
    expect((await errorOf(opponent)).message).toBe(`The opponent ${other.teamCharacterId} is not in Team Game.`);
    expect({ rows: await storedBoards(w), log: await boardLog(w) }).toEqual(before);
  });

  test("a board on the public demo game, against another character of it", async () => {
    const w = await world();
    as(w, "coach");
    const res = await create(w, {
      ...newBoard(w),
      characterId: w.demoCharacterId,
      edition: "1-1",
      opponentId: w.demoCharacterId,
    });
    expect(res.status).toBe(201);
    expect(((await res.json()) as { board: BoardDto }).board.game.slug).toBe("vesper-circuit");
  });
});

describe("a board's permalink", () => {
  const link = (w: World, visibility: "team" | "link", board = w.board.id) => ({
    kind: "board",
    teamId: w.team.id,
    view: { board },
    visibility,
  });
  const made = async (res: Response) => {
    expect(res.status).toBe(201);
    return ((await res.json()) as { permalink: PermalinkDto }).permalink;
  };

  test("is pinned to the board's character and Edition and shows the board as it is saved now", async () => {
    const w = await world();
    as(w, "player");
    const permalink = await made(await share(w, link(w, "link")));
    expect(permalink).toMatchObject({
      kind: "board",
      view: { board: w.board.id },
      characterId: w.teamCharacterId,
      edition: { slug: "0-1" },
      title: "Board: Pressure after the poke · Sparring Dummy · edition 0-1",
    });
    as(w, "coach");
    const document = boardDocument();
    document.situations[0]!.name = "After the poke, revised";
    await save(w, w.board.id, { version: 1, title: "Revised", document });

    const shared = await loadSharedView({ slug: permalink.slug, viewerId: null });
    if (shared.status !== "ok" || shared.view.kind !== "board") throw new Error("expected a board's view");
    expect(shared.view.board).toMatchObject({ id: w.board.id, version: 2, title: "Revised", document });
    // Open to anyone with the link: it names neither the team nor who saved it.
    expect(shared.view.board).not.toHaveProperty("team");
    expect(shared.view.board).not.toHaveProperty("updatedBy");
    const sent = JSON.stringify(shared.view);
    for (const hidden of [w.team.name, w.team.slug, w.people.coach.id]) expect(sent).not.toContain(hidden);
  });

  test("team-only, revoked, deleted and unknown all answer unavailable, as for an Explorer link", async () => {
    const w = await world();
    as(w, "player");
    const teamOnly = await made(await share(w, link(w, "team")));
    expect((await loadSharedView({ slug: teamOnly.slug, viewerId: w.people.viewer.id })).status).toBe("ok");
    expect(await loadSharedView({ slug: teamOnly.slug, viewerId: null })).toEqual({ status: "unavailable" });
    expect(await loadSharedView({ slug: teamOnly.slug, viewerId: w.people.outsider.id })).toEqual({
      status: "unavailable",
    });

    const revoked = await made(await share(w, link(w, "link")));
    await revokePermalink({ slug: revoked.slug, actorId: w.people.player.id });
    expect(await loadSharedView({ slug: revoked.slug, viewerId: w.people.player.id })).toEqual({
      status: "unavailable",
    });

    const open = await made(await share(w, link(w, "link")));
    as(w, "coach");
    expect((await remove(w, w.board.id, 1)).status).toBe(204);
    expect(await loadSharedView({ slug: open.slug, viewerId: w.people.coach.id })).toEqual({ status: "unavailable" });
  });

  test("another team's board cannot be shared: the answer an unknown board gets, and nothing written", async () => {
    const w = await world();
    const other = await world();
    const elsewhere = await createBoard({
      teamId: other.team.id,
      actorId: other.people.owner.id,
      characterId: other.teamCharacterId,
      editionSlug: "0-1",
      opponentId: null,
      title: "Theirs",
      origin: null,
      document: boardDocument(),
    });
    as(w, "owner");
    const theirs = await share(w, link(w, "link", elsewhere.id));
    const none = await share(w, link(w, "link", 3_999_999_999));
    expect(theirs.status).toBe(404);
    expect((await errorOf(theirs)).message).toBe(`There is no board ${elsewhere.id}.`);
    expect((await errorOf(none)).message).toBe("There is no board 3999999999.");
    // A viewer may not share at all, as for an Explorer view.
    as(w, "viewer");
    expect((await share(w, link(w, "link"))).status).toBe(403);
  });
});
