import { randomUUID } from "node:crypto";
import { expect, test, type Page } from "@playwright/test";
import { query } from "./db";
import { ExplorerPage } from "./pages/explorer-page";
import { joinAsPlayer, signUpAs, TeamsPage } from "./pages/team-pages";

// A coach's Mix-up board from first click to a shared link: made at the demo's mid/low guess
// point (Tarrow's n.v), a cell overridden, a child situation added, solved, a note written,
// saved, reloaded and shared; a player opens the link read-only; a second coach saving an old
// copy is shown both versions.

test.describe.configure({ timeout: 240_000 });

test.beforeEach(async () => {
  await query("delete from rate_limits");
});

const tag = () => randomUUID().slice(0, 6);

async function expectNoSeriousAxe(page: Page, where: string) {
  const { default: AxeBuilder } = await import("@axe-core/playwright");
  const results = await new AxeBuilder({ page }).analyze();
  const bad = results.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(bad.map((v) => `${where} ${v.id}: ${v.nodes.length} node(s), e.g. ${v.nodes[0]?.target.join(" ")}`)).toEqual(
    [],
  );
}

/** A cell of the open situation by its attacker option and defender answer. */
const cell = (page: Page, row: string, col: string) =>
  page.getByTestId("matrix").locator(`button[data-row="${row}"][data-col="${col}"]`);

test("a coach makes a board at a guess point, solves it, teaches it and shares it; a player reads it", async ({
  page,
  browser,
}) => {
  const teamName = `Tide Room ${tag()}`;
  await signUpAs(page, "Player Ysomarrow", `coach-${tag()}@example.test`, "/teams");
  await new TeamsPage(page).create(teamName);

  // The guess point: after n.v the string goes on into a mid (n.v.t) or a low (n.v.r).
  await page.goto("/games/vesper-circuit/tarrow/explore/n");
  const explorer = new ExplorerPage(page);
  await explorer.select("n.v");
  await expect(explorer.field("input")).toHaveText("n.v");
  await page.getByRole("button", { name: "Make a board" }).click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel("Title").fill("Tarrow's n.v split");
  await dialog.getByRole("button", { name: "Make the board" }).click();
  await expect(page).toHaveURL(/\/teams\/[^/]+\/boards\/\d+$/);
  const boardUrl = page.url();

  // Filled from the engine: a blocked low leaves the defender crouching; a high ducked whiffs.
  await cell(page, "n.v.r", "Crouch guard").click();
  await expect(page.getByTestId("cell-source")).toContainText("crouching");
  await cell(page, "n.v.n", "Crouch guard").click();
  await expect(page.getByTestId("cell-source")).toContainText(/duck|whiff/i);
  await cell(page, "n.v.t", "Crouch guard").click();
  await expect(page.getByTestId("cell-source")).toContainText("From the engine");

  // Solved on every change: both mixes and a value.
  await expect(page.getByTestId("board-value")).toContainText(/[+-]?\d/);
  await expect(page.getByTestId("attacker-mix").locator("li")).toHaveCount(
    await page.getByTestId("matrix").locator("tbody th[scope=row]").count(),
  );
  const valueBefore = await page.getByTestId("board-value").textContent();

  // An override: the cell is marked, and the value moves.
  await cell(page, "n.v.r", "Stand guard").click();
  await page.getByTestId("cell-payoff").fill("60");
  await expect(cell(page, "n.v.r", "Stand guard")).toHaveAttribute("data-overridden", "true");
  await expect(page.getByTestId("board-value")).not.toHaveText(valueBefore ?? "");

  // A child situation after the cancel into the stance, filled by hand.
  const cancelRow = await page.getByTestId("matrix").locator("button[data-row*='~']").first().getAttribute("data-row");
  await cell(page, cancelRow!, "Stand guard").click();
  await page.getByRole("button", { name: "New situation from here" }).click();
  await page.getByLabel("Situation name").fill("In the back-step");
  await cell(page, "Option 1", "Answer 1").click();
  await page.getByTestId("cell-payoff").fill("12");
  await cell(page, "Option 2", "Answer 2").click();
  await page.getByTestId("cell-payoff").fill("9");
  // 12 and 9 on the diagonal, 0 off it: value 12·9 / (12 + 9) = 5.14 (the 2x2 closed form, common practice, no source).
  await expect(page.getByTestId("situation").locator('[data-field="situation-value"]')).toContainText("+5.14");
  await page.getByLabel("Coach's note").fill("Mix the two: the back-step keeps your turn.");
  await page.getByRole("button", { name: "Save" }).click();
  await expect(page.getByTestId("save-state")).toHaveText("Saved · version 2");

  // No serious accessibility problem on the editor.
  await expectNoSeriousAxe(page, "board editor");
  // Reloaded: everything is where it was.
  await page.reload();
  await page.getByRole("navigation", { name: "Situations" }).getByRole("button", { name: "In the back-step" }).click();
  await expect(page.getByLabel("Coach's note")).toHaveValue("Mix the two: the back-step keeps your turn.");
  await page.getByRole("navigation", { name: "Situations" }).getByRole("button").first().click();
  await expect(cell(page, "n.v.r", "Stand guard")).toHaveAttribute("data-overridden", "true");

  // Shared, and the board is on the team page.
  await page.getByRole("button", { name: "Share" }).click();
  await page.getByRole("dialog").getByRole("button", { name: "Make the link" }).click();
  const link = await page.getByTestId("permalink-url").inputValue();
  await page.getByRole("dialog").getByRole("button", { name: "Close" }).click();

  // A player of the team opens the link: read-only, note and numbers there.
  const player = await joinAsPlayer(browser, teamName, "Player Orrinax");
  await player.goto(link);
  await expect(player.getByTestId("board")).toBeVisible();
  await expect(player.getByRole("button", { name: "Save" })).toHaveCount(0);
  await expect(player.getByLabel("Board title")).toHaveCount(0);
  await player
    .getByRole("navigation", { name: "Situations" })
    .getByRole("button", { name: "In the back-step" })
    .click();
  await expect(player.getByTestId("note")).toHaveText("Mix the two: the back-step keeps your turn.");
  await expect(player.getByTestId("cell-payoff")).toHaveCount(0);
  await expectNoSeriousAxe(player, "shared board");

  // The team page lists the board for the player too.
  await player.goto(boardUrl.replace(/\/boards\/\d+$/, ""));
  await expect(player.getByTestId("board-list")).toContainText("Tarrow's n.v split");
  await page.goto(boardUrl.replace(/\/boards\/\d+$/, ""));
  await expect(page.getByTestId("team-log")).toContainText("saved the Mix-up board “Tarrow's n.v split” (version 2)");
  await page.goto(boardUrl);

  // A second coach opens the board, the first saves, the second saves an old copy.
  const second = await (await browser.newContext()).newPage();
  const secondEmail = `coach-${tag()}@example.test`;
  await signUpAs(second, "Player Brannowisp", secondEmail, "/teams");
  await query(
    `insert into memberships (team_id, user_id, role)
     select t.id, u.id, 'coach' from teams t, users u where t.name = ? and u.email = ?`,
    [teamName, secondEmail],
  );
  await second.goto(boardUrl);
  await page.getByLabel("Board title").fill("Tarrow's n.v split (first coach)");
  await page.getByRole("button", { name: "Save" }).click();
  await expect(page.getByTestId("save-state")).toHaveText("Saved · version 3");

  await second.getByLabel("Board title").fill("Tarrow's n.v split (second coach)");
  await second.getByRole("button", { name: "Save" }).click();
  const conflict = second.getByTestId("board-conflict");
  await expect(conflict).toBeVisible();
  await expect(conflict.locator("[data-side=theirs]")).toContainText("(first coach)");
  await expect(conflict.locator("[data-side=yours]")).toContainText("(second coach)");
  await conflict.getByRole("button", { name: "Save mine over theirs" }).click();
  await expect(second.getByTestId("save-state")).toHaveText("Saved · version 4");
});
