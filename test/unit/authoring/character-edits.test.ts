import { afterAll, beforeAll, describe, expect, test, vi } from "vitest";
import * as edgeRoute from "@/app/api/games/[game]/editions/[edition]/characters/[character]/edges/[edge]/route";
import { POST as addEdge } from "@/app/api/games/[game]/editions/[edition]/characters/[character]/edges/route";
import * as moveRoute from "@/app/api/games/[game]/editions/[edition]/characters/[character]/moves/[move]/route";
import { POST as addMove } from "@/app/api/games/[game]/editions/[edition]/characters/[character]/moves/route";
import { closeDb } from "@/server/db";
import { listAudit } from "@/server/db/queries/audit";
import { createStance, publishEdition } from "@/server/db/queries/authoring";
import { rowCounts } from "../character-io/fixtures";
import { asUser } from "../teams/parallel-session";
import { twoCoachesAndADraft, type TwoCoaches } from "./two-coaches";

// A coach edits a draft from the Explorer: follow-ups, cancels, stance moves, links changed and
// deleted, moves deleted with what hangs off them. Every answer is checked against the rows.

vi.mock("@/server/auth", () => import("../teams/parallel-session"));

let ctx: TwoCoaches;

beforeAll(async () => {
  ctx = await twoCoachesAndADraft({
    team: "Graph Editors",
    game: "Edit Game",
    character: "Orlen",
    users: ["edit-a", "edit-b"],
  });
  await createStance({
    teamId: ctx.teamId,
    gameId: ctx.game.id,
    editionId: ctx.edition.id,
    characterId: ctx.characterId,
    actorId: ctx.coaches[0]!.id,
    input: { key: "coil", name: "Low Coil", abbreviation: "LC" },
  });
});

afterAll(async () => {
  await ctx.remove();
  await closeDb();
});

const base = () => ({ game: ctx.game.slug, edition: ctx.edition.slug, character: "orlen" });
type Handler = (request: Request, c: { params: Promise<Record<string, string>> }) => Promise<Response>;

function call(handler: unknown, method: string, params: Record<string, string>, body?: unknown, query = "", coach = 0) {
  return asUser(ctx.coaches[coach]!, () =>
    (handler as Handler)(
      new Request(`http://test/api${query}`, {
        method,
        ...(body === undefined ? {} : { headers: { "content-type": "application/json" }, body: JSON.stringify(body) }),
      }),
      { params: Promise.resolve({ ...base(), ...params }) },
    ),
  );
}

const hit = (input: string, onBlock: number) => ({
  input,
  name: `Hit ${input}`,
  level: "mid",
  damage: 10,
  startup: 12,
  onBlock,
  onHit: 4,
  onCounterHit: 6,
});

/** Moves and links of the character in the draft (stances and the log are checked where they matter). */
async function counts() {
  const { moves, edges } = await rowCounts({
    editionId: ctx.edition.id,
    characterId: ctx.characterId,
    teamId: ctx.teamId,
  });
  return { moves, edges };
}

describe("editing a draft's graph", () => {
  test("a move, a follow-up of it, a cancel into a stance and a stance move", async () => {
    expect((await call(addMove, "POST", {}, { move: hit("1", -1) })).status).toBe(201);
    const follow = await call(
      addMove,
      "POST",
      {},
      {
        move: hit("1,2", -12),
        via: { kind: "follow", from: "1", input: ",2", gapOnBlock: 3, comboOnHit: true, comboOnCounterHit: true },
      },
    );
    expect(follow.status).toBe(201);
    expect(await follow.json()).toMatchObject({
      move: { key: "1,2", version: 1, move: { onBlock: -12 } },
      edge: { key: "1>1,2", version: 1, edge: { kind: "follow", gapOnBlock: 3 } },
    });
    const cancel = await call(
      addEdge,
      "POST",
      {},
      {
        edge: {
          kind: "cancel",
          from: "1,2",
          to: "coil",
          input: "~b",
          onBlock: -4,
          onHit: 6,
          onCounterHit: 8,
          autoGuard: ["high"],
        },
      },
    );
    expect(cancel.status).toBe(201);
    expect(await cancel.json()).toMatchObject({ key: "1,2~b>coil", edge: { onBlock: -4 } });
    const stanceMove = await call(
      addMove,
      "POST",
      {},
      { move: hit("LC.2", -6), via: { kind: "enter", from: "coil", input: "2" } },
    );
    expect(stanceMove.status).toBe(201);
    expect(await counts()).toEqual({ moves: 3, edges: 3 });
    const log = (await listAudit({ teamId: ctx.teamId })).map((e) => e.action);
    expect(log.slice(-4)).toEqual(["move.added", "move.added", "edge.added", "move.added"]);
  });

  test("a link changed from the version read; a second save from the same version gets 409 with theirs", async () => {
    const key = encodeURIComponent("1>1,2");
    const read = (await (await call(edgeRoute.GET, "GET", { edge: key })).json()) as { version: number };
    const first = await call(
      edgeRoute.PATCH,
      "PATCH",
      { edge: key },
      // The input is sent as it is: the log names only the field that changed.
      { version: read.version, changes: { gapOnBlock: 7, input: ",2" } },
    );
    expect(first.status).toBe(200);
    expect((await listAudit({ teamId: ctx.teamId })).at(-1)).toMatchObject({
      action: "edge.changed",
      detail: { edge: "1>1,2", fields: "gapOnBlock" },
    });
    const late = await call(
      edgeRoute.PATCH,
      "PATCH",
      { edge: key },
      { version: read.version, changes: { gapOnBlock: 1 } },
      "",
      1,
    );
    expect(late.status).toBe(409);
    expect(await late.json()).toMatchObject({
      error: { code: "conflict", current: { version: read.version + 1, edge: { gapOnBlock: 7 } } },
    });
  });

  test("a change that would loop hits, or a field of another kind of link, is refused at its field and writes nothing", async () => {
    const before = await counts();
    const logBefore = (await listAudit({ teamId: ctx.teamId })).length;
    const loop = await call(
      addEdge,
      "POST",
      {},
      {
        edge: {
          kind: "follow",
          from: "1,2",
          to: "1",
          input: ",1",
          gapOnBlock: 0,
          comboOnHit: false,
          comboOnCounterHit: false,
        },
      },
    );
    expect(loop.status).toBe(400);
    expect(((await loop.json()) as { error: { message: string } }).error.message).toMatch(/loop/);
    const read = (await (await call(edgeRoute.GET, "GET", { edge: encodeURIComponent("1>1,2") })).json()) as {
      version: number;
    };
    const wrong = await call(
      edgeRoute.PATCH,
      "PATCH",
      { edge: encodeURIComponent("1>1,2") },
      { version: read.version, changes: { onBlock: -3 } },
    );
    expect(wrong.status).toBe(400);
    expect(await counts()).toEqual(before);
    expect((await listAudit({ teamId: ctx.teamId })).length).toBe(logBefore);
  });

  test("deleting a move says first what goes with it, then takes exactly that", async () => {
    const read = await call(moveRoute.GET, "GET", { move: "1" });
    const body = (await read.json()) as { version: number; dependents: { moves: string[]; edges: string[] } };
    expect(body.dependents).toEqual({ moves: ["1,2"], edges: ["1>1,2", "1,2~b>coil"] });
    const stale = await call(moveRoute.DELETE, "DELETE", { move: "1" }, undefined, `?version=${body.version + 5}`);
    expect(stale.status).toBe(409);
    expect(await counts()).toEqual({ moves: 3, edges: 3 });
    const gone = await call(moveRoute.DELETE, "DELETE", { move: "1" }, undefined, `?version=${body.version}`);
    expect(gone.status).toBe(200);
    expect(await gone.json()).toEqual({ deleted: "1", with: body.dependents });
    // The stance move stays: it hangs off the stance, not the deleted string.
    expect(await counts()).toEqual({ moves: 1, edges: 1 });
  });

  test("a published Edition refuses every edit with 409", async () => {
    await publishEdition({
      teamId: ctx.teamId,
      gameId: ctx.game.id,
      editionId: ctx.edition.id,
      actorId: ctx.coaches[0]!.id,
    });
    const before = await counts();
    expect((await call(addMove, "POST", {}, { move: hit("2", -3) })).status).toBe(409);
    const read = (await (await call(moveRoute.GET, "GET", { move: "LC.2" })).json()) as { version: number };
    expect(
      (await call(moveRoute.DELETE, "DELETE", { move: "LC.2" }, undefined, `?version=${read.version}`)).status,
    ).toBe(409);
    expect(await counts()).toEqual(before);
  });
});
