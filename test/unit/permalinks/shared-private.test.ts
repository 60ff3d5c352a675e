import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { closeDb, getDb } from "@/server/db";
import { createPermalink, loadSharedView } from "@/server/db/queries/permalinks";
import { editions, games } from "@/server/db/schema";
import { DEMO_CHARACTERS } from "@/server/db/seed/demo";
import { seedCharacter } from "@/server/db/seed";
import { makePeople, stringView } from "./fixtures";

// A team's private game with three characters and two Editions; a link anyone may open
// shows one character in one Edition, and must carry nothing else of the game.
const people = makePeople();
const ctx = { team: 0, player: "", pinned: 0, opponent: 0 };
const CAST = ["Player Ardentquill", "Player Sablequill", "Player Valewright-3"] as const;
const EDITIONS = [
  { slug: "1-0", name: "Closed Trial" },
  { slug: "1-1", name: "Closed Trial Two" },
] as const;

beforeAll(async () => {
  ctx.player = await people.user("Player Ione");
  ctx.team = await people.team({ [ctx.player]: "player" });
  const db = getDb();
  const gameSlug = `private-${ctx.team}`;
  const [game] = await db
    .insert(games)
    .values({ slug: gameSlug, name: "Private Game", teamId: ctx.team })
    .$returningId();
  await db
    .insert(editions)
    .values(EDITIONS.map((e, i) => ({ gameId: game!.id, ...e, releasedOn: new Date(Date.UTC(2026, i * 6, 1)) })));
  const ids = [];
  for (const [i, name] of CAST.entries()) {
    const from = DEMO_CHARACTERS[i % DEMO_CHARACTERS.length]!;
    ids.push(await seedCharacter(db, gameSlug, { ...from, slug: name.toLowerCase().replace(" ", "-"), name }));
  }
  [ctx.pinned, ctx.opponent] = ids as [number, number];
  // Links are made on published Editions.
  await db.update(editions).set({ status: "published" }).where(eq(editions.gameId, game!.id));
});
// Removing the team removes its game, and with it the characters and Editions.
afterAll(async () => {
  await people.cleanup();
  await closeDb();
});

async function shared(opponent: number | null) {
  const made = await createPermalink({
    teamId: ctx.team,
    createdBy: ctx.player,
    characterId: ctx.pinned,
    editionSlug: "1-0",
    view: stringView({ opponent }),
    visibility: "link",
  });
  const loaded = await loadSharedView({ slug: made.slug, viewerId: null });
  if (loaded.status !== "ok" || loaded.view.kind !== "explorer") throw new Error(`the link is ${loaded.status}`);
  return loaded.view;
}

describe("a public link into a private game", () => {
  test("carries the pinned character in the pinned Edition, and no other character or Edition", async () => {
    const view = await shared(null);
    expect(view.data.cast.map((c) => c.name)).toEqual(["Player Ardentquill"]);
    expect(view.data.editions.map((e) => e.name)).toEqual(["Closed Trial"]);
    expect(view.data.graph.nodes.length).toBeGreaterThan(0);
    expect(view.opponent).toBeNull();
    // What the page hands to the browser is this object: none of it names the rest.
    const sent = JSON.stringify(view);
    for (const hidden of ["Player Sablequill", "Player Valewright-3", "Closed Trial Two"])
      expect(sent).not.toContain(hidden);
  });

  test("shared with an opponent, carries that opponent's moves too, and still nobody else", async () => {
    const view = await shared(ctx.opponent);
    expect(view.data.cast.map((c) => c.name).sort()).toEqual(["Player Ardentquill", "Player Sablequill"]);
    expect(view.opponent?.character.name).toBe("Player Sablequill");
    expect(view.opponent?.editions.map((e) => e.slug)).toEqual(["1-0"]);
    expect(view.opponent?.graph.nodes.length).toBeGreaterThan(0);
    const sent = JSON.stringify(view);
    for (const hidden of ["Player Valewright-3", "Closed Trial Two"]) expect(sent).not.toContain(hidden);
  });
});
