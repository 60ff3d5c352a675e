import { expect, test } from "@playwright/test";
import { query } from "./db";
import { ExplorerPage } from "./pages/explorer-page";

/** A move's (or, with `edges`, a cancel's) on-block frames as MariaDB holds them. */
async function onBlockIn(table: "moves" | "edges", key: string, edition: string): Promise<number> {
  const [row] = await query<{ on_block: string }>(
    `select x.on_block from ${table} x join characters c on c.id = x.character_id join editions e on e.id = x.edition_id
       join games gm on gm.id = c.game_id
     where gm.slug = 'vesper-circuit' and c.slug = 'tarrow' and e.slug = ? and x.\`key\` = ?`,
    [edition, key],
  );
  return Number(row?.on_block);
}

const onBlock = (key: string, edition = "1-1") => onBlockIn("moves", key, edition);
const cancelOnBlock = (key: string, edition = "1-1") => onBlockIn("edges", key, edition);

const signed = (n: number) => (n > 0 ? `+${n}` : String(n));

test("a player opens a string from the move list, picks a node and reads its path", async ({ page }) => {
  await page.goto("/games/vesper-circuit/tarrow");
  await page.getByRole("link", { name: "v", exact: true }).click();
  await expect(page).toHaveURL(/\/explore\/v\?/);

  const explorer = new ExplorerPage(page);
  await expect(explorer.emptyCard).toBeVisible();
  await explorer.select("v.v.t");

  const raw = await onBlock("v.v.t");
  await expect(explorer.field("input")).toContainText("v.v.t");
  await expect(explorer.field("onBlock")).toHaveText(signed(raw));
  await expect(explorer.field("blockClass")).toHaveText("punishable"); // -14 with the demo's 11-frame fastest attack
  await expect(explorer.field("naturalCombo")).toContainText("yes");

  // The cancel into Ember Guard: its own outcome, and the frames it saves over stopping at v.v.t.
  await explorer.select("stance:ember");
  const cancelled = await cancelOnBlock("v.v.t~press>ember");
  await expect(explorer.field("input")).toContainText("v.v.t~press");
  await expect(explorer.field("onBlock")).toHaveText(signed(cancelled));
  await expect(explorer.field("framesSaved")).toContainText(`${cancelled - raw}f`);
  await expect(explorer.field("blockClass")).toHaveText("safe");
  await expect(explorer.field("autoGuard")).toContainText("high, mid");
});

test("a figure explains itself on focus and on hover (a tap on a phone), and hides again", async ({
  page,
  hasTouch,
}) => {
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/v");
  await explorer.select("v.v.t");
  const why = explorer.explanation("onBlock");
  await expect(why).toBeHidden();

  await explorer.field("onBlock").locator("xpath=..").focus();
  await expect(why).toBeVisible();
  await expect(why).toContainText(`${signed(await onBlock("v.v.t"))} on block`);
  // The figure's accessible description is the same text.
  await expect(explorer.field("onBlock").locator("xpath=..")).toHaveAccessibleDescription(/./);

  await page.keyboard.press("Tab");
  await expect(why).toBeHidden();
  // A touch screen has no hover: a tap focuses the figure instead.
  if (hasTouch) await explorer.field("onBlock").tap();
  else await explorer.field("onBlock").hover();
  await expect(why).toBeVisible();
});

test("the selected path and the options survive a reload, and an option recomputes at once", async ({ page }) => {
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/v");
  await explorer.select("v.v.t");
  await expect(explorer.field("blockClass")).toHaveText("punishable");

  // With the opponent's fastest attack at 15 frames, -14 is no longer punishable.
  await explorer.setOption("Opponent's fastest", 15);
  await expect(explorer.field("blockClass")).toHaveText("safe");
  await expect(page).toHaveURL(/fastest=15/);

  await page.reload();
  await expect(explorer.field("input")).toContainText("v.v.t");
  await expect(explorer.field("blockClass")).toHaveText("safe");
});

test("an Edition switch shows that Edition's numbers for the same path", async ({ page }) => {
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/v");
  await explorer.select("stance:ember");
  await expect(explorer.field("onBlock")).toHaveText(signed(await cancelOnBlock("v.v.t~press>ember", "1-1")));

  await page.getByRole("combobox", { name: "Edition" }).selectOption("1-0");
  await expect(page).toHaveURL(/edition=1-0/);
  await expect(explorer.field("onBlock")).toHaveText(signed(await cancelOnBlock("v.v.t~press>ember", "1-0")));
});

test("an unknown move is a 404", async ({ page }) => {
  const response = await page.goto("/games/vesper-circuit/tarrow/explore/9%2C9%2C9");
  expect(response?.status()).toBe(404);
});

test("a blocked low leaves the defender crouching, and the card lists the punishers that come out of a crouch", async ({
  page,
}) => {
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/n");
  await explorer.select("n.v.r"); // ends in a low, punishable on block
  await expect(explorer.field("defenderStance")).toHaveText("crouching");

  const panel = page.getByTestId("punish-panel");
  await expect(panel.getByTestId("punish-verdict")).toContainText("crouching");
  const startups = await query<{ input: string; startup: number; from_posture: string }>(
    `select m.input, m.startup, m.from_posture from moves m join characters c on c.id = m.character_id
       join editions e on e.id = m.edition_id join games gm on gm.id = c.game_id
     where gm.slug = 'vesper-circuit' and c.slug = 'tarrow' and e.slug = '1-1' and m.startup is not null and m.stance_id is null`,
  );
  // A long list starts folded to the best few; unfold it to read every punisher.
  const more = panel.getByRole("button", { name: /^Show all \d+$/ }).first();
  if (await more.isVisible()) await more.click();
  const listed = await panel
    .locator("[data-testid=punishers] [data-option]")
    .evaluateAll((els) => els.map((e) => e.getAttribute("data-option")));
  const behind = -(await onBlock("n.v.r"));
  const expected = startups.filter((m) => m.startup <= behind && m.from_posture !== "standing").map((m) => m.input);
  expect(listed.sort()).toEqual(expected.sort());
  expect(listed.length).toBeGreaterThan(0);

  // Against another opponent the list is theirs.
  await panel.getByRole("combobox", { name: "Opponent" }).selectOption({ label: "Quessaline" });
  await expect(page).toHaveURL(/vs=\d+/);
  await expect(panel.getByTestId("punish-verdict")).toContainText("Quessaline");
});

test("a long follow-up list shows the best 8 first and unfolds to all of them", async ({ page }) => {
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/n");
  await explorer.select("n"); // the first hit alone: after it, ten of the character's moves are guaranteed or frame traps
  const list = page.locator("[data-follow-ups='a hit']");
  const rows = list.locator("[data-option]");
  const more = list.getByRole("button", { name: /^Show all \d+$/ });
  await expect(rows).toHaveCount(8);
  const best = await rows.evaluateAll((els) => els.map((e) => e.getAttribute("data-option")));

  const total = Number((await more.textContent())!.match(/\d+/)![0]);
  expect(total).toBeGreaterThan(8);
  await more.click();
  await expect(rows).toHaveCount(total);
  // Unfolding adds the rest below; the best stay first, in their order.
  expect((await rows.evaluateAll((els) => els.map((e) => e.getAttribute("data-option")))).slice(0, 8)).toEqual(best);
  await expect(list.getByRole("button", { name: "Show the best 8" })).toHaveAttribute("aria-expanded", "true");

  await list.getByRole("button", { name: "Show the best 8" }).click();
  await expect(rows).toHaveCount(8);
});

test("the table of all paths filters, and selecting a row selects the path in the graph and back", async ({ page }) => {
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/v");
  const table = page.getByTestId("paths-table");
  const rows = table.locator("tr[data-path-key]");
  await expect(rows.first()).toBeVisible();
  const total = await rows.count();
  expect(total).toBeGreaterThan(3);

  await table.getByLabel(/stance only/i).check();
  await expect(rows).not.toHaveCount(total);
  const inStance = await rows.locator('[data-field="endsIn"]').allTextContents();
  expect(inStance.length).toBeGreaterThan(0);
  expect(new Set(inStance.map((t) => t.trim()))).toEqual(new Set(["stance"]));

  await rows.filter({ hasText: "v.v.t~press" }).first().click();
  await expect(explorer.field("input")).toContainText("v.v.t~press");
  await expect(explorer.pathMark("stance:ember")).toHaveCount(1);

  await table.getByLabel(/stance only/i).uncheck();
  await explorer.select("v.v");
  await expect(table.locator('tr[aria-selected="true"]')).toContainText("v.v");
});

test("the graph works from the keyboard: arrows move, Enter selects, Escape clears", async ({ page }) => {
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/v");
  const canvas = page.getByRole("group", { name: /Move graph/ });
  await canvas.focus();
  await page.keyboard.press("ArrowRight");
  await expect(explorer.focusMark).toHaveAttribute("data-focus-node", "v.v");
  await page.keyboard.press("Enter");
  await expect(explorer.field("input")).toHaveText("v.v");

  await page.keyboard.press("ArrowRight");
  const first = await explorer.focusMark.getAttribute("data-focus-node");
  await page.keyboard.press("ArrowDown");
  const second = await explorer.focusMark.getAttribute("data-focus-node");
  expect(new Set([first, second])).toEqual(new Set(["v.v.t", "v.v.nv"]));
  await page.keyboard.press("Enter");
  await expect(explorer.field("input")).toHaveText(second!);

  await page.keyboard.press("Escape");
  await expect(explorer.emptyCard).toBeVisible();
});

test("the graph exports as a PNG", async ({ page }) => {
  await page.goto("/games/vesper-circuit/tarrow/explore/v");
  const download = page.waitForEvent("download");
  await page.getByRole("button", { name: "Export PNG" }).click();
  const file = await download;
  expect(file.suggestedFilename()).toMatch(/^framefork-tarrow-v-1-1\.png$/);
  const path = await file.path();
  const { readFileSync } = await import("node:fs");
  const bytes = readFileSync(path);
  expect(bytes.subarray(1, 4).toString()).toBe("PNG");
  expect(bytes.length).toBeGreaterThan(5_000);
});

test("the Path card reads each hit's level and the path's damage from the data", async ({ page }) => {
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/n");
  // On a phone n.v.t lies off the first view, a pan away: the click goes to the node itself.
  await explorer.node("n.v.t").dispatchEvent("click");
  const rows = await query<{ key: string; level: string; damage: number }>(
    `select m.\`key\`, m.level, m.damage from moves m join characters c on c.id = m.character_id join editions e on e.id = m.edition_id
       join games gm on gm.id = c.game_id
     where gm.slug = 'vesper-circuit' and c.slug = 'tarrow' and e.slug = '1-1' and m.\`key\` in ('n', 'n.v', 'n.v.t')`,
  );
  const byKey = new Map(rows.map((r) => [r.key, r]));
  const levels = await explorer.card
    .locator("ol [data-level]")
    .evaluateAll((els) => els.map((e) => e.getAttribute("data-level")));
  expect(levels).toEqual(["n", "n.v", "n.v.t"].map((k) => byKey.get(k)?.level));
  const damage = ["n", "n.v", "n.v.t"].reduce((sum, k) => sum + (byKey.get(k)?.damage ?? 0), 0);
  await expect(explorer.field("damage")).toHaveText(String(damage));
});

test("a safe ending says so plainly in the punish panel", async ({ page }) => {
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/n");
  await explorer.select("n.v"); // -3 on block
  const panel = page.getByTestId("punish-panel");
  await panel.getByRole("combobox", { name: "Opponent" }).selectOption({ label: "Brannoch" });
  await expect(panel.getByTestId("punish-verdict")).toContainText(/^Safe/);
  await expect(panel.getByTestId("punishers")).toHaveCount(0);
});

test("sorting the table by damage puts the most damaging path first", async ({ page }) => {
  await page.goto("/games/vesper-circuit/tarrow/explore/v");
  const table = page.getByTestId("paths-table");
  await expect(table.locator("tr[data-path-key]").first()).toBeVisible();
  await table.getByRole("button", { name: /^Damage/ }).click();
  await expect(table.getByRole("columnheader", { name: /Damage/ })).toHaveAttribute("aria-sort", "descending");
  const shown = (await table.locator('tr[data-path-key] [data-field="damage"]').allTextContents()).map(Number);
  expect(shown.length).toBeGreaterThan(3);
  expect(shown).toEqual([...shown].sort((a, b) => b - a));
});

test("on a phone the Path card leads, and the graph follows as a view to pan", async ({ browser }) => {
  const page = await browser.newPage({ viewport: { width: 390, height: 844 } });
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/v");
  await explorer.select("v.v");
  await expect(explorer.card).toBeVisible();
  const graph = await explorer.graph.boundingBox();
  const card = await explorer.card.boundingBox();
  expect(graph && card && card.y + card.height <= graph.y).toBe(true);
  await page.close();
});

/**
 * The smallest text of every node on screen, in CSS pixels as drawn: each text's font size
 * times the zoom React Flow's viewport is drawn at.
 */
async function smallestNodeText(page: import("@playwright/test").Page) {
  return page.evaluate(() => {
    const viewport = document.querySelector<HTMLElement>(".react-flow__viewport")!;
    const zoom = new DOMMatrixReadOnly(getComputedStyle(viewport).transform).a;
    const canvas = document.querySelector<HTMLElement>("[data-testid=graph]")!.getBoundingClientRect();
    let smallest = Infinity;
    let seen = 0;
    for (const node of document.querySelectorAll<HTMLElement>("[data-node-id]")) {
      const box = node.getBoundingClientRect();
      if (box.right < canvas.left || box.left > canvas.right || box.bottom < canvas.top || box.top > canvas.bottom)
        continue;
      seen++;
      for (const el of node.querySelectorAll<HTMLElement>("span")) {
        if (!el.textContent?.trim()) continue;
        smallest = Math.min(smallest, parseFloat(getComputedStyle(el).fontSize) * zoom);
      }
    }
    return { smallest, seen };
  });
}

for (const [who, size] of [
  ["a laptop", { width: 1366, height: 768 }],
  ["a phone", { width: 390, height: 844 }],
] as const) {
  test(`on ${who}, the graph's first view is readable: node text of 12 px or more, the selected path's end on screen`, async ({
    browser,
  }, testInfo) => {
    test.skip(testInfo.project.name !== "desktop", "each screen size is set here: one project is enough");
    const page = await browser.newPage({ viewport: size });
    const explorer = new ExplorerPage(page);
    // Quessaline's n is the demo's widest string: it loops between two stances.
    await page.goto("/games/vesper-circuit/quessaline/explore/n");
    await expect(explorer.node("n")).toBeVisible();
    const first = await smallestNodeText(page);
    expect(first.seen).toBeGreaterThan(0);
    expect(first.smallest).toBeGreaterThanOrEqual(12);

    // A path picked far along the string, reloaded: its end is drawn inside the canvas.
    const ids = await explorer.graph
      .locator("[data-node-id]")
      .evaluateAll((els) => els.map((e) => e.getAttribute("data-node-id")!));
    const far = ids.at(-1)!;
    await explorer.node(far).dispatchEvent("click");
    await expect(explorer.pathMark(far)).toBeAttached();
    await expect(page).toHaveURL(/[?&]path=/);
    await page.reload();
    await expect(explorer.pathMark(far)).toBeAttached();
    const canvas = (await explorer.graph.boundingBox())!;
    const end = (await explorer.node(far).boundingBox())!;
    expect(end.x).toBeGreaterThanOrEqual(canvas.x - 1);
    expect(end.x + end.width).toBeLessThanOrEqual(canvas.x + canvas.width + 1);
    expect(end.y).toBeGreaterThanOrEqual(canvas.y - 1);
    expect(end.y + end.height).toBeLessThanOrEqual(canvas.y + canvas.height + 1);
    expect((await smallestNodeText(page)).smallest).toBeGreaterThanOrEqual(12);
    await page.close();
  });
}

test("the Explorer has no serious or critical accessibility violations", async ({ page }) => {
  // axe reads every node of the graph: on a busy machine that alone can take half a minute.
  test.setTimeout(60_000);
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/v");
  await explorer.select("v.v.t");
  await expect(explorer.card).toBeVisible();
  const { default: AxeBuilder } = await import("@axe-core/playwright");
  const results = await new AxeBuilder({ page }).analyze();
  const bad = results.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(bad.map((v) => `${v.id}: ${v.nodes.length} node(s), e.g. ${v.nodes[0]?.target.join(" ")}`)).toEqual([]);
});
