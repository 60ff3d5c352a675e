import { describe, expect, test } from "vitest";
import { createElement } from "react";
import { renderToString } from "react-dom/server";
import { SharedExplorer } from "@/components/explorer/shared-explorer";
import { createPermalink, loadSharedView } from "@/server/db/queries/permalinks";
import { DEMO_GAME } from "@/server/db/seed/demo";
import { playerInTeam, stringView } from "./fixtures";

// The server render of `/s/[slug]`'s body: what a visitor sees before any script runs.
const ctx = playerInTeam("Player Jo");

async function rendered(over: Parameters<typeof stringView>[0] = {}) {
  const made = await createPermalink({
    teamId: ctx.team,
    createdBy: ctx.player,
    characterId: ctx.characterId,
    editionSlug: "1-0",
    view: stringView(over),
    visibility: "link",
  });
  const loaded = await loadSharedView({ slug: made.slug, viewerId: null });
  if (loaded.status !== "ok" || loaded.view.kind !== "explorer") throw new Error(loaded.status);
  return renderToString(createElement(SharedExplorer, { view: loaded.view }));
}

describe("SharedExplorer", () => {
  test("shows the title, who shared it, the pinned Edition and a link to the live Explorer, without an Edition switch", async () => {
    const html = await rendered({ options: { maxDepth: 5, maxStanceVisits: 1, fastest: DEMO_GAME.fastest } });
    expect(html).toContain("Tarrow · v.v.t · edition 1-0");
    expect(html).toContain("Shared by <!-- -->Player Jo");
    expect(html).toMatch(/Pinned to edition<\/span><span[^>]*>1\.0 Launch</);
    expect(html).not.toMatch(/>Edition<\/span><select/);
    const href = /href="([^"]+)"[^>]*>Open in the live Explorer/.exec(html)?.[1]?.replaceAll("&amp;", "&");
    expect(href).toBe("/games/vesper-circuit/tarrow/explore/v?edition=1-0&path=v%3Ev.v%7Cv.v%3Ev.v.t&depth=5");
  });

  test("has no Share button (a shared view is read, not re-shared from here)", async () => {
    expect(await rendered()).not.toContain(">Share<");
  });
});
