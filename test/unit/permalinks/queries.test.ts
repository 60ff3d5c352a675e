import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { and, eq } from "drizzle-orm";
import { AppError } from "@/lib/errors";
import { getDb, closeDb } from "@/server/db";
import { auditLog, permalinks } from "@/server/db/schema";
import {
  createPermalink,
  getPermalinkBySlug,
  isCacheableLink,
  LINK_STATE_SECONDS,
  listTeamPermalinks,
  loadSharedView,
  revokePermalink,
} from "@/server/db/queries/permalinks";
import { makePeople, stringView, tarrow } from "./fixtures";

// Against the seeded test database that `npm test` prepares; people and teams are this file's own.
const people = makePeople();
let coach: string, player: string, viewer: string, outsider: string, other: string;
let team: number, otherTeam: number, characterId: number;

beforeAll(async () => {
  coach = await people.user("Coach Ada");
  player = await people.user("Player Bo");
  viewer = await people.user(null);
  outsider = await people.user("Outsider Cy");
  other = await people.user("Other Di");
  team = await people.team({ [coach]: "coach", [player]: "player", [viewer]: "viewer" });
  otherTeam = await people.team({ [other]: "owner" });
  characterId = (await tarrow()).character.id;
});
afterAll(async () => {
  await people.cleanup();
  await closeDb();
});

const make = (over: Partial<Parameters<typeof createPermalink>[0]> = {}) =>
  createPermalink({
    teamId: team,
    createdBy: player,
    characterId,
    editionSlug: "1-1",
    view: stringView(),
    visibility: "link",
    ...over,
  });

async function rowsFor(teamId: number) {
  const db = getDb();
  const [links, audit] = await Promise.all([
    db.select().from(permalinks).where(eq(permalinks.teamId, teamId)),
    db.select().from(auditLog).where(eq(auditLog.teamId, teamId)),
  ]);
  return { links, audit };
}

async function expectAppError(promise: Promise<unknown>, code: string, message: RegExp) {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(AppError);
  expect((error as AppError).code).toBe(code);
  expect((error as AppError).message).toMatch(message);
}

describe("createPermalink", () => {
  test("writes the permalink and its audit entry, with a title from the path's input", async () => {
    const made = await make();
    expect(made).toMatchObject({
      title: "Tarrow · v.v.t · edition 1-1",
      visibility: "link",
      teamId: team,
      characterId,
      edition: { slug: "1-1" },
      view: stringView(),
      createdBy: { id: player, name: "Player Bo" },
      revokedAt: null,
      path: `/s/${made.slug}`,
    });
    const [row] = await getDb().select().from(permalinks).where(eq(permalinks.slug, made.slug));
    expect(row?.view).toEqual(stringView());
    const [entry] = await getDb()
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.teamId, team), eq(auditLog.action, "permalink.created")));
    expect(entry).toMatchObject({
      actorId: player,
      detail: expect.objectContaining({ slug: made.slug, visibility: "link" }),
    });
    // A DTO, not a row: no internal id or edition foreign key.
    expect(Object.keys(made)).not.toContain("id");
    expect(Object.keys(made)).not.toContain("editionId");
  });

  test("writes nothing when the root, the path, the Edition, the opponent or the character is wrong", async () => {
    const before = await rowsFor(team);
    await expectAppError(
      make({ view: stringView({ root: "1'; drop table users; --", path: null }) }),
      "bad_request",
      /no move "1'; drop table users; --"/,
    );
    await expectAppError(
      make({ view: stringView({ path: "2>2,2|<script>alert(1)</script>" }) }),
      "bad_request",
      /does not continue/,
    );
    await expectAppError(make({ editionSlug: "9-9" }), "not_found", /no Edition "9-9"/);
    await expectAppError(make({ view: stringView({ opponent: 987_654_321 }) }), "bad_request", /opponent/);
    await expectAppError(make({ characterId: 987_654_321 }), "not_found", /no character/);
    const after = await rowsFor(team);
    expect(after.links.length).toBe(before.links.length);
    expect(after.audit.length).toBe(before.audit.length);
  });

  test("the root alone is a view, titled by the root's input", async () => {
    const made = await make({ view: stringView({ root: "sink+r", path: null }) });
    expect(made.title).toBe("Tarrow · sink+r · edition 1-1");
  });
});

describe("pinned to an Edition", () => {
  test("a link made on 1-0 keeps 1-0's numbers although 1-1 is the newest", async () => {
    const made = await make({ editionSlug: "1-0", view: stringView({ root: "sink+r", path: "" }) });
    const loaded = await loadSharedView({ slug: made.slug, viewerId: null });
    if (loaded.status !== "ok" || loaded.view.kind !== "explorer") throw new Error(`expected ok, got ${loaded.status}`);
    expect(loaded.view.edition.slug).toBe("1-0");
    expect(loaded.view.data.edition.slug).toBe("1-0");
    // The shared view knows its own Edition only (the game's newest is 1-1).
    expect(loaded.view.data.editions.map((e) => e.slug)).toEqual(["1-0"]);
    const shin = loaded.view.data.graph.nodes.find((n) => n.id === "sink+r");
    // The demo's sink+r is -12 on block in 1-0 and -13 in 1-1 (test/unit/db/queries.test.ts reads both).
    expect(shin?.kind === "move" && shin.onBlock).toBe(-12);
    expect((await getPermalinkBySlug({ slug: made.slug }))?.edition.slug).toBe("1-0");
  });
});

describe("listTeamPermalinks", () => {
  test("lists the team's own links newest first with their creators, never another team's", async () => {
    const mine = await make({ createdBy: coach, visibility: "team" });
    const theirs = await make({ teamId: otherTeam, createdBy: other });
    const list = await listTeamPermalinks({ teamId: team });
    expect(list.map((l) => l.slug)).toContain(mine.slug);
    expect(list.map((l) => l.slug)).not.toContain(theirs.slug);
    expect(list.find((l) => l.slug === mine.slug)).toMatchObject({
      createdBy: { id: coach, name: "Coach Ada" },
      revoked: false,
      visibility: "team",
    });
    const times = list.map((l) => l.createdAt);
    expect(times).toEqual([...times].sort().reverse());
    expect((await listTeamPermalinks({ teamId: otherTeam })).map((l) => l.slug)).toEqual([theirs.slug]);
  });
});

describe("revokePermalink", () => {
  test("the creator revokes once; again changes nothing; the list marks it", async () => {
    const made = await make();
    const first = await revokePermalink({ slug: made.slug, actorId: player });
    expect(first.revokedAt).not.toBeNull();
    const again = await revokePermalink({ slug: made.slug, actorId: player });
    expect(again.revokedAt).toBe(first.revokedAt);
    const entries = await getDb()
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.teamId, team), eq(auditLog.action, "permalink.revoked")));
    expect(entries.filter((e) => e.detail.slug === made.slug)).toHaveLength(1);
    expect((await listTeamPermalinks({ teamId: team })).find((l) => l.slug === made.slug)?.revoked).toBe(true);
  });

  test("a coach may revoke a player's link; a viewer may not; an outsider is told there is no such link", async () => {
    const made = await make();
    await expectAppError(
      revokePermalink({ slug: made.slug, actorId: viewer }),
      "forbidden",
      /creator|coach or owner|made this link/,
    );
    await expectAppError(revokePermalink({ slug: made.slug, actorId: outsider }), "not_found", /no such permalink/);
    expect((await getPermalinkBySlug({ slug: made.slug }))?.revokedAt).toBeNull();
    expect((await revokePermalink({ slug: made.slug, actorId: coach })).revokedAt).not.toBeNull();
  });
});

describe("isCacheableLink", () => {
  test("a link anyone may open is cacheable; a team-only one is not; revoking it stops it at once in this process", async () => {
    const shared = await make();
    const teamOnly = await make({ visibility: "team" });
    expect(await isCacheableLink(shared.slug)).toBe(true);
    expect(await isCacheableLink(teamOnly.slug)).toBe(false);
    expect(await isCacheableLink("AAAAAAAAAAAAAAAAAAAAAAAA")).toBe(false);
    expect(await isCacheableLink("not a slug")).toBe(false);
    await revokePermalink({ slug: shared.slug, actorId: player });
    expect(await isCacheableLink(shared.slug)).toBe(false);
  });

  test("a link revoked by another app server (a change to its row this process did not make) stops within LINK_STATE_SECONDS", async () => {
    const shared = await make();
    expect(await isCacheableLink(shared.slug)).toBe(true);
    const db = getDb();
    await db.update(permalinks).set({ revokedAt: new Date() }).where(eq(permalinks.slug, shared.slug));
    await new Promise((resolve) => setTimeout(resolve, LINK_STATE_SECONDS * 1000 + 50));
    expect(await isCacheableLink(shared.slug)).toBe(false);
  });
});

describe("loadSharedView", () => {
  test("anyone opens a link-visible permalink, with the view and who shared it", async () => {
    const made = await make();
    const loaded = await loadSharedView({ slug: made.slug, viewerId: null });
    expect(loaded).toMatchObject({
      status: "ok",
      view: {
        title: made.title,
        creatorName: "Player Bo",
        visibility: "link",
        view: stringView(),
        character: { slug: "tarrow" },
      },
    });
  });

  test("a team-only permalink: signed out or outsider → unavailable, as an unknown link; member → ok", async () => {
    const made = await make({ visibility: "team" });
    expect(await loadSharedView({ slug: made.slug, viewerId: null })).toEqual({ status: "unavailable" });
    expect(await loadSharedView({ slug: made.slug, viewerId: outsider })).toEqual({ status: "unavailable" });
    expect((await loadSharedView({ slug: made.slug, viewerId: viewer })).status).toBe("ok");
  });

  test("unknown, malformed and revoked slugs are all unavailable, even to members", async () => {
    const made = await make();
    await revokePermalink({ slug: made.slug, actorId: coach });
    expect(await loadSharedView({ slug: made.slug, viewerId: coach })).toEqual({ status: "unavailable" });
    expect(await loadSharedView({ slug: "A".repeat(24), viewerId: coach })).toEqual({ status: "unavailable" });
    expect(await loadSharedView({ slug: "' or 1=1 --", viewerId: null })).toEqual({ status: "unavailable" });
  });
});
