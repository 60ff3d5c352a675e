import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { eq } from "drizzle-orm";
import { AppError } from "@/lib/errors";
import { formatOutcome, stanceSheet } from "@/lib/engine";
import { tracePath } from "@/lib/permalink";
import { closeDb, getDb } from "@/server/db";
import { auditLog, permalinks } from "@/server/db/schema";
import { getExplorerData } from "@/server/db/queries/explorer";
import {
  createStancePermalink,
  listTeamPermalinks,
  loadSharedView,
  revokePermalink,
} from "@/server/db/queries/permalinks";
import { summarizeSharedView } from "@/server/og";
import { makePeople, tarrow } from "./fixtures";

// A stance sheet's permalink (kind "stance"), against the seeded demo: Tarrow's Drift stance.
const people = makePeople();
let player: string, outsider: string, member: string;
let team: number, characterId: number;

beforeAll(async () => {
  player = await people.user("Player Sheet");
  member = await people.user("Viewer Sheet");
  outsider = await people.user("Outsider Sheet");
  team = await people.team({ [player]: "player", [member]: "viewer" });
  characterId = (await tarrow()).character.id;
});
afterAll(async () => {
  await people.cleanup();
  await closeDb();
});

const make = (over: Partial<Parameters<typeof createStancePermalink>[0]> = {}) =>
  createStancePermalink({
    teamId: team,
    createdBy: player,
    characterId,
    editionSlug: "1-1",
    view: { stance: "drift" },
    visibility: "link",
    ...over,
  });

async function refusal(promise: Promise<unknown>) {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(AppError);
  return error as AppError;
}

describe("createStancePermalink", () => {
  test("writes a stance link and its audit entry, titled by the stance, character and Edition", async () => {
    const made = await make();
    expect(made).toMatchObject({ kind: "stance", view: { stance: "drift" }, edition: { slug: "1-1" } });
    expect(made.title).toBe("Stance: Drift · Tarrow · edition 1-1");
    const [entry] = await getDb().select().from(auditLog).where(eq(auditLog.teamId, team));
    expect(entry).toMatchObject({ action: "permalink.created" });
    expect(entry!.detail).toMatchObject({ slug: made.slug, stance: "drift", edition: "1-1" });
    const listed = await listTeamPermalinks({ teamId: team });
    expect(listed.find((l) => l.slug === made.slug)?.kind).toBe("stance");
  });

  test("an unknown stance or Edition is refused and writes nothing", async () => {
    const before = await getDb().select().from(permalinks).where(eq(permalinks.teamId, team));
    expect((await refusal(make({ view: { stance: "nowhere" } }))).message).toMatch(/no stance "nowhere"/);
    expect((await refusal(make({ editionSlug: "9-9" }))).code).toBe("not_found");
    const after = await getDb().select().from(permalinks).where(eq(permalinks.teamId, team));
    expect(after).toHaveLength(before.length);
  });
});

describe("loadSharedView of a stance link", () => {
  test("carries the engine's sheet for the pinned Edition, each way in's path tracing to its input", async () => {
    const made = await make({ editionSlug: "1-0" });
    const loaded = await loadSharedView({ slug: made.slug, viewerId: null });
    if (loaded.status !== "ok" || loaded.view.kind !== "stance") throw new Error("expected a stance view");
    const { sheet } = loaded.view;
    // The engine, run here on the same Edition's graph with the game's rules.
    const data = await getExplorerData({ characterId, edition: "1-0" });
    if (!data.ok) throw new Error("no 1-0");
    const { graph, game } = data.data;
    expect(sheet.sheet).toEqual(stanceSheet(graph, "stance:drift", { fastest: game.fastest, launchAt: game.launchAt }));
    expect(sheet.edition).toMatchObject({ slug: "1-0" });
    expect(sheet.stance).toEqual({ key: "drift", name: "Drift" });
    expect(sheet.sheet.waysIn.length).toBeGreaterThan(0);
    // Each row's Explorer path starts at a move, chains edge to edge and spells the way in's input.
    for (const w of sheet.sheet.waysIn) {
      const at = sheet.paths[w.cancel]!;
      expect(tracePath(graph, { root: at.root, path: at.path })).toEqual({ ok: true, input: w.input });
      expect(at.path.split("|").at(-1)).toBe(w.cancel);
      expect(graph.edges.some((e) => e.kind === "follow" && e.to === at.root)).toBe(false);
    }
  });

  test("team-only: a member opens it; signed out and an outsider get what an unknown link gets; revoked is gone", async () => {
    const made = await make({ visibility: "team" });
    expect(await loadSharedView({ slug: made.slug, viewerId: null })).toEqual({ status: "unavailable" });
    expect(await loadSharedView({ slug: made.slug, viewerId: outsider })).toEqual({ status: "unavailable" });
    expect((await loadSharedView({ slug: made.slug, viewerId: member })).status).toBe("ok");
    await revokePermalink({ slug: made.slug, actorId: player });
    expect(await loadSharedView({ slug: made.slug, viewerId: member })).toEqual({ status: "unavailable" });
  });

  test("its preview names the stance, the number of ways in and the best one; a team-only one shows nothing", async () => {
    const made = await make();
    const loaded = await loadSharedView({ slug: made.slug, viewerId: null });
    if (loaded.status !== "ok" || loaded.view.kind !== "stance") throw new Error("expected a stance view");
    const best = loaded.view.sheet.sheet.waysIn[0]!;
    expect(summarizeSharedView(loaded.view)).toEqual({
      kind: "stance",
      title: made.title,
      stance: "Drift",
      waysIn: loaded.view.sheet.sheet.waysIn.length,
      best: {
        input: best.input,
        onBlock: formatOutcome(best.cancelled.onBlock),
        blockClass: best.cancelled.blockClass,
      },
    });
    const teamOnly = await make({ visibility: "team" });
    const seen = await loadSharedView({ slug: teamOnly.slug, viewerId: member });
    if (seen.status !== "ok") throw new Error("a member sees it");
    expect(summarizeSharedView(seen.view)).toEqual({ kind: "private" });
  });
});
