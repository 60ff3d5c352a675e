import { randomUUID } from "node:crypto";
import { readFile } from "node:fs/promises";
import { expect, test, type Page } from "@playwright/test";
import {
  explainAfterCancel,
  formatOutcome,
  framesSavedLabel,
  stanceSheet,
  turnsPunishableSafe,
  type MoveGraph,
  type StanceSheet,
} from "@/lib/engine";
import { query } from "./db";
import { ExplorerPage } from "./pages/explorer-page";
import { joinAsPlayer, signUpAs, TeamsPage } from "./pages/team-pages";

// The stance sheet of the demo's Tarrow, Drift stance: every figure on the page is checked against
// the engine's stanceSheet run here on the graph the app serves (GET /api/characters/[id]/graph).

const MOVE_LIST = "/games/vesper-circuit/tarrow";
const SHEET = `${MOVE_LIST}/stances/drift`;

async function expectNoSeriousAxe(page: Page, where: string) {
  const { default: AxeBuilder } = await import("@axe-core/playwright");
  const results = await new AxeBuilder({ page }).analyze();
  const bad = results.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(bad.map((v) => `${where} ${v.id}: ${v.nodes.length} node(s), e.g. ${v.nodes[0]?.target.join(" ")}`)).toEqual(
    [],
  );
}

/** The engine's sheet of Drift in 1-1, with the game's rules, from the graph the app serves. */
async function engineSheet(page: Page) {
  const [tarrow] = await query<{ id: number }>(
    "select c.id from characters c join games g on g.id = c.game_id where g.slug = 'vesper-circuit' and c.slug = 'tarrow'",
  );
  const res = await page.request.get(`/api/characters/${tarrow!.id}/graph?edition=1-1`);
  expect(res.status()).toBe(200);
  const data = (await res.json()) as { graph: MoveGraph; game: { fastest: number; launchAt: number } };
  const rules = { fastest: data.game.fastest, launchAt: data.game.launchAt };
  return { sheet: stanceSheet(data.graph, "stance:drift", rules), rules };
}

/** What a row of the ways in must read, from the engine. */
const expectedRows = (waysIn: StanceSheet["waysIn"]) =>
  waysIn.map((w) => [
    w.input,
    formatOutcome(w.raw.onBlock),
    formatOutcome(w.cancelled.onBlock),
    w.framesSaved === null ? "—" : framesSavedLabel(w.framesSaved),
    formatOutcome(w.cancelled.onHit),
    formatOutcome(w.cancelled.onCounterHit),
  ]);

/** The ways in as the page shows them, row by row. */
async function readRows(page: Page) {
  return page
    .locator("tr[data-way-in]")
    .evaluateAll((rows) =>
      rows.map((row) =>
        ["input", "raw-onBlock", "onBlock", "framesSaved", "onHit", "onCounterHit"].map(
          (f) => (row.querySelector(`[data-field="${f}"]`) as HTMLElement | null)?.innerText.trim() ?? "",
        ),
      ),
    );
}

const filter = (page: Page) => page.getByRole("checkbox", { name: "Only cancels that turn a punishable ending safe" });

test("a visitor reads a stance sheet from the move list, filters it, opens a way in in the Explorer and saves it as a PNG", async ({
  page,
}, testInfo) => {
  // Axe and a PNG export on a loaded machine: more than the default 30 s.
  test.setTimeout(120_000);
  if (testInfo.project.name === "phone") await page.setViewportSize({ width: 390, height: 844 });
  const { sheet, rules } = await engineSheet(page);
  const safe = sheet.waysIn.filter((w) => turnsPunishableSafe(w.raw.onBlock, w.cancelled.onBlock, rules));
  // The demo has both kinds, so the filter has something to leave out.
  expect(safe.length).toBeGreaterThan(0);
  expect(safe.length).toBeLessThan(sheet.waysIn.length);

  await page.goto(MOVE_LIST);
  await page.getByRole("link", { name: "Every way into Drift and what follows it →" }).click();
  await expect(page).toHaveURL(/\/stances\/drift\?edition=1-1$/);
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Drift");
  await expect(page.locator("tr[data-way-in]")).toHaveCount(sheet.waysIn.length);
  expect(await readRows(page)).toEqual(expectedRows(sheet.waysIn));
  // The stance's own moves, by input.
  await expect(page.locator("tr[data-stance-move]")).toHaveCount(sheet.moves.length);
  // The page itself never scrolls sideways, on a phone too: the tables scroll in their own boxes.
  expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);

  // The filter: in the address, and still there after a reload.
  await filter(page).check();
  await expect(page).toHaveURL(/[?&]safe=1/);
  await expect(page.locator("tr[data-way-in]")).toHaveCount(safe.length);
  await page.reload();
  await expect(filter(page)).toBeChecked();
  expect(await readRows(page)).toEqual(expectedRows(safe));
  await filter(page).uncheck();
  await expect(page).not.toHaveURL(/safe=1/);
  await expect(page.locator("tr[data-way-in]")).toHaveCount(sheet.waysIn.length);

  // A grid cell explains its gap on keyboard focus: the sum and what it means.
  const cell = sheet.grid.find((c) => c.gapOnBlock !== null)!;
  const way = sheet.waysIn.find((w) => w.cancel === cell.cancel)!;
  const move = sheet.moves.find((m) => m.enter === cell.enter)!;
  const gap = page
    .locator(`td[data-cancel="${cell.cancel}"][data-enter="${cell.enter}"]`)
    .locator("[tabindex='0']", { has: page.locator('[data-field="gapOnBlock"]') });
  await gap.focus();
  await expect(gap.getByRole("tooltip")).toBeVisible();
  await expect(gap.getByRole("tooltip")).toHaveText(
    explainAfterCancel(way.cancelled.onBlock, move.startup, { fastest: rules.fastest })!.gap,
  );

  await expectNoSeriousAxe(page, "stance sheet");

  // Saved as a PNG, named for the character, the stance and the Edition.
  const [download] = await Promise.all([
    page.waitForEvent("download"),
    page.getByRole("button", { name: "Save as PNG" }).click(),
  ]);
  expect(download.suggestedFilename()).toBe("framefork-tarrow-drift-1-1.png");
  const bytes = await readFile((await download.path())!);
  expect([...bytes.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

  // A way in opens in the Explorer with its path selected; from there, back to the sheet.
  const first = sheet.waysIn[0]!;
  await page.getByRole("link", { name: `${first.input} in the Explorer` }).click();
  await expect(page).toHaveURL(/\/explore\//);
  const explorer = new ExplorerPage(page);
  await expect(explorer.field("input")).toHaveText(first.input);
  await expect(explorer.field("onBlock")).toHaveText(formatOutcome(first.cancelled.onBlock));
  await page.getByTestId("stance-sheet-link").getByRole("link").click();
  await expect(page).toHaveURL(/\/stances\/drift\?edition=1-1$/);
});

test("a player shares a stance sheet; anyone with the link reads the same figures", async ({ page, browser }) => {
  test.setTimeout(120_000);
  const { sheet } = await engineSheet(page);
  const teamName = `Sheet Crew ${randomUUID().slice(0, 6)}`;
  await query("delete from rate_limits");
  await signUpAs(page, "Coach Vantreelo", `owner-${randomUUID().slice(0, 8)}@example.test`, "/teams");
  await new TeamsPage(page).create(teamName);
  const player = await joinAsPlayer(browser, teamName, "Player Ressaquill-5");

  await player.goto(SHEET);
  await player.getByRole("button", { name: "Share" }).click();
  const dialog = player.getByRole("dialog", { name: "Share this stance sheet" });
  await dialog.getByRole("combobox", { name: "Team" }).selectOption({ label: teamName });
  await dialog.getByRole("radio", { name: /Anyone with the link/ }).check();
  await dialog.getByRole("button", { name: "Make the link" }).click();
  const link = await player.getByTestId("permalink-url").inputValue();
  expect(link).toMatch(/\/s\/[A-Za-z0-9_-]{24}$/);

  // Signed out, in a fresh browser.
  const stranger = await (await browser.newContext()).newPage();
  await stranger.goto(link);
  await expect(stranger.getByText("Permalink · Stance: Drift · Tarrow · edition 1-1")).toBeVisible();
  await expect(stranger.locator("tr[data-way-in]")).toHaveCount(sheet.waysIn.length);
  expect(await readRows(stranger)).toEqual(expectedRows(sheet.waysIn));
  await expectNoSeriousAxe(stranger, "shared stance sheet");
  // Its preview image is a PNG of its own.
  const image = await stranger.request.get(`${new URL(link).pathname}/opengraph-image`);
  expect(image.status()).toBe(200);
  expect(image.headers()["content-type"]).toBe("image/png");
  await player.context().close();
  await stranger.context().close();
});
