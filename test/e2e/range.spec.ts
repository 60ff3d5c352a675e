import { expect, test, type Page } from "@playwright/test";
import { formatRange, parseRange, reachesAt, stanceSheet, type GraphNode } from "@/lib/engine";
import type { GraphResponse } from "@/lib/explorer";
import { query } from "./db";
import { ExplorerPage } from "./pages/explorer-page";
import { MoveListPage } from "./pages/move-list-page";

// The demo game measures range in numbers. The move list keeps the strings whose first hit reaches a
// distance, the stance sheet the stance's moves that do, and the Path card reads each hit's range;
// the expected rows come from the graph the app serves, read with the engine's range rules.

/** The demo's first character and its newest Edition as the Explorer's graph route serves them. */
async function demo(page: Page) {
  const [row] = await query<{ id: number; game: string; slug: string }>(
    `select c.id, g.slug as game, c.slug from characters c join games g on g.id = c.game_id
     where g.team_id is null order by c.id limit 1`,
  );
  const res = await page.request.get(`/api/characters/${row!.id}/graph`);
  expect(res.status()).toBe(200);
  const data = (await res.json()) as GraphResponse;
  expect(data.game.range).toMatchObject({ kind: "number" });
  const node = new Map(data.graph.nodes.map((n) => [n.id, n]));
  const rangeOf = (id: string) => {
    const n = node.get(id) as GraphNode | undefined;
    return n?.kind === "move" ? n.range : undefined;
  };
  return { ...row!, data, rangeOf, base: `/games/${row!.game}/${row!.slug}` };
}

/** A distance some of these ranges reach and some do not: the middle of the distinct ones. */
function splitting(ranges: (number | null)[]): number {
  const distinct = [...new Set(ranges.filter((r): r is number => r !== null))].sort((a, b) => a - b);
  expect(distinct.length, "the demo needs first hits of different ranges").toBeGreaterThan(1);
  return distinct[Math.floor(distinct.length / 2)]!;
}

test("the move list keeps the strings whose first hit reaches a distance, and the address keeps it", async ({
  page,
}) => {
  const { data, rangeOf, base } = await demo(page);
  const list = new MoveListPage(page);
  const d = splitting(data.roots.map((id) => parseRange(rangeOf(id))));
  const expected = data.roots.filter((id) => reachesAt(rangeOf(id), d)).length;

  await page.goto(base);
  await list.filters.getByRole("spinbutton", { name: /First hit reaches at/ }).fill(String(d));
  await expect(list.count).toHaveText(`${expected} of ${data.roots.length} strings`);
  await expect(page).toHaveURL(new RegExp(`reach=${d}`));
  const shown = await list.strings.locator('[data-field="range"]').allTextContents();
  expect(shown).toHaveLength(expected);
  for (const text of shown) expect(Number.parseFloat(text.replace("reaches ", ""))).toBeGreaterThanOrEqual(d);

  await page.reload();
  await expect(list.count).toHaveText(`${expected} of ${data.roots.length} strings`);
});

test("the stance sheet keeps the stance's moves that reach, in its list and its grid", async ({ page }) => {
  const { data, rangeOf, base } = await demo(page);
  const rules = { fastest: data.game.fastest, launchAt: data.game.launchAt };
  const stance = data.graph.nodes
    .filter((n) => n.kind === "stance")
    .map((s) => ({ s, moves: stanceSheet(data.graph, s.id, rules).moves }))
    .find(({ moves }) => new Set(moves.map((m) => parseRange(rangeOf(m.move)))).size > 1);
  expect(stance, "the demo needs a stance whose moves reach differently").toBeDefined();
  const { s, moves } = stance!;
  const d = Math.max(...moves.map((m) => parseRange(rangeOf(m.move)) ?? 0));
  const reaching = moves.filter((m) => reachesAt(rangeOf(m.move), d));

  await page.goto(`${base}/stances/${encodeURIComponent(s.id.replace(/^stance:/, ""))}`);
  const rows = page.locator("tr[data-stance-move]");
  await expect(rows).toHaveCount(moves.length);
  await page.getByRole("spinbutton", { name: /Stance moves that reach at/ }).fill(String(d));
  await expect(rows).toHaveCount(reaching.length);
  await expect(rows.locator('[data-field="range"]')).toHaveText(
    reaching.map((m) => formatRange(rangeOf(m.move), data.game.range)!),
  );
  const grid = page.getByTestId("stance-grid");
  if (await grid.isVisible()) await expect(grid.locator("thead th")).toHaveCount(1 + reaching.length);
  await expect(page).toHaveURL(new RegExp(`reach=${d}`));

  await page.getByRole("spinbutton", { name: /Stance moves that reach at/ }).fill("999");
  await expect(page.getByText(/reaches at 999/).first()).toBeVisible();
});

test("the Path card reads each hit's range in the game's unit", async ({ page }) => {
  const { data, rangeOf, base } = await demo(page);
  const root = data.roots.find((id) => parseRange(rangeOf(id)) !== null);
  expect(root, "the demo needs a first hit with a range").toBeDefined();
  const explorer = new ExplorerPage(page);
  await page.goto(`${base}/explore/${encodeURIComponent(root!)}`);
  await explorer.node(root!).dispatchEvent("click");
  await expect(explorer.card.locator('ol [data-field="range"]').first()).toContainText(
    formatRange(rangeOf(root!), data.game.range)!,
  );
});
