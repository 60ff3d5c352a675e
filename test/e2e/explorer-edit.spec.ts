import { randomUUID } from "node:crypto";
import { readFile } from "node:fs/promises";
import { expect, test, type Page } from "@playwright/test";
import { query } from "./db";
import { MoveListPage } from "./pages/move-list-page";
import { ExplorerPage } from "./pages/explorer-page";
import { joinAsPlayer, signUpAs, TeamsPage } from "./pages/team-pages";

// A coach changes a draft from the Explorer: a follow-up added from the keyboard, a number
// changed, a save that someone else beat (both values shown, the coach chooses), a move deleted
// with what goes with it; a player of the team sees the draft and no edit control.

test.describe.configure({ timeout: 180_000 });

test.beforeEach(async () => {
  await query("delete from rate_limits");
});

const tag = () => randomUUID().slice(0, 6);

/** A team game with Merrith (the example file) in its draft Edition; answers the addresses. */
async function teamGameWithMerrith(page: Page) {
  const teamName = `Quayside ${tag()}`;
  await signUpAs(page, "Player Tessarine", `coach-${tag()}@example.test`, "/teams");
  await new TeamsPage(page).create(teamName);
  const team = page.url().split("/teams/")[1]!;
  const made = await page.request.post(`/api/teams/${team}/games`, { data: { name: `Lampwire ${tag()}` } });
  expect(made.status()).toBe(201);
  const { game, edition } = (await made.json()) as { game: { slug: string }; edition: { slug: string } };
  expect((await page.request.post(`/api/games/${game.slug}/characters`, { data: { name: "Merrith" } })).status()).toBe(
    201,
  );
  const csv = await readFile("public/examples/merrith.csv");
  const imported = await page.request.post(
    `/api/games/${game.slug}/editions/${edition.slug}/characters/merrith/import`,
    { multipart: { file: { name: "merrith.csv", mimeType: "text/csv", buffer: csv } } },
  );
  expect(imported.status()).toBe(200);
  return { teamName, game: game.slug, edition: edition.slug };
}

test("a coach adds a follow-up, changes a number, meets a conflict and deletes a move, all from the Explorer", async ({
  page,
  browser,
}) => {
  const t = await teamGameWithMerrith(page);
  const explorer = new ExplorerPage(page);
  await page.goto(`/games/${t.game}/merrith/explore/n?edition=${t.edition}`);
  const editor = page.getByTestId("draft-editor");
  await expect(editor).toContainText("Change this draft");

  // Select the end of n.v and add a follow-up, from the keyboard.
  await explorer.select("n.v");
  await expect(editor).toContainText("n.v");
  await page.keyboard.press("f");
  const add = page.getByRole("form", { name: "A follow-up of n.v" });
  await add.getByLabel("Link input").fill(".n");
  await add.getByLabel("Gap on block").fill("2");
  await add.getByLabel("Input", { exact: true }).fill("n.v.n");
  await add.getByLabel("Name", { exact: true }).fill("Spark Flurry");
  await add.getByLabel("Damage").fill("8");
  await add.getByLabel("On block", { exact: true }).fill("-3x");
  await add.getByLabel("On hit", { exact: true }).fill("4");
  await add.getByLabel("On counter hit", { exact: true }).fill("6");
  await add.getByRole("button", { name: "Add move" }).click();
  // A wrong value is named at its field, in words, and nothing is sent.
  await expect(add.getByText(/must be a whole number/)).toBeVisible();
  await add.getByLabel("On block", { exact: true }).fill("-3");
  await add.getByLabel("On block", { exact: true }).press("Enter");
  await expect(editor.getByRole("status")).toHaveText("Added n.v.n.");
  // The graph and the selected path recompute at once: the new hit is drawn and selected.
  await expect(explorer.node("n.v.n")).toBeVisible();
  await expect(explorer.pathMark("n.v.n")).toBeVisible();
  await expect(explorer.field("onBlock")).toContainText("-3");

  // Change its number: the path's outcome follows.
  await page.keyboard.press("e");
  const edit = page.getByRole("form", { name: "Edit n.v.n" });
  await edit.getByLabel("On block", { exact: true }).fill("+1");
  await edit.getByRole("button", { name: "Save move" }).click();
  await expect(editor.getByRole("status")).toHaveText("Saved n.v.n.");
  await expect(explorer.field("onBlock")).toContainText("+1");

  // Someone else saves the same move while this coach is editing it: both values are shown.
  await page.keyboard.press("e");
  await edit.getByLabel("Damage").fill("11");
  const base = `/api/games/${t.game}/editions/${t.edition}/characters/merrith/moves/${encodeURIComponent("n.v.n")}`;
  const now = (await (await page.request.get(base)).json()) as { version: number };
  expect((await page.request.patch(base, { data: { version: now.version, changes: { damage: 9 } } })).status()).toBe(
    200,
  );
  await edit.getByRole("button", { name: "Save move" }).click();
  const conflict = page.getByTestId("conflict");
  await expect(conflict).toContainText("Someone saved n.v.n after you opened it");
  await expect(conflict.getByRole("row", { name: /Damage/ })).toContainText(/9\s*11/);
  await conflict.getByRole("button", { name: "Save mine over theirs" }).click();
  await expect(editor.getByRole("status")).toHaveText("Saved n.v.n.");
  const [saved] = await query<{ damage: number }>(
    "select m.damage from moves m join editions e on e.id = m.edition_id join games g on g.id = e.game_id where g.slug = ? and m.`key` = 'n.v.n'",
    [t.game],
  );
  expect(saved?.damage).toBe(11);

  // A cancel into a stance the character does not have yet: the stance is made with it.
  await explorer.select("n");
  await page.keyboard.press("c");
  const cancel = page.getByRole("form", { name: "A cancel from n" });
  await cancel.getByLabel("Into the stance").selectOption({ label: "A new stance…" });
  await cancel.getByLabel("Stance name").fill("Ember Guard");
  await cancel.getByLabel("Short label").fill("ember");
  await cancel.getByLabel("Stance key").fill("ember");
  await cancel.getByLabel("Cancel input").fill("~u");
  await cancel.getByLabel("On block", { exact: true }).fill("-1");
  await cancel.getByLabel("On hit", { exact: true }).fill("4");
  await cancel.getByLabel("On counter hit", { exact: true }).fill("4");
  await cancel.getByLabel("On counter hit", { exact: true }).press("Enter");
  await expect(editor.getByRole("status")).toHaveText("Added the cancel n~u>ember.");
  await expect(explorer.node("stance:ember")).toBeVisible();

  // Deleting n.v says what goes with it and asks first.
  await explorer.select("n.v");
  await page.keyboard.press("Delete");
  const ask = page.getByRole("alertdialog", { name: "Delete n.v?" });
  await expect(ask.getByTestId("delete-dependents")).toContainText("move n.v.n");
  await expect(ask.getByTestId("delete-dependents")).toContainText("move n.v.t");
  await ask.getByRole("button", { name: "Keep it" }).click();
  await expect(explorer.node("n.v")).toBeVisible();
  await page.keyboard.press("Delete");
  await ask.getByRole("button", { name: /^Delete n.v and \d+ more$/ }).click();
  await expect(explorer.node("n.v")).toHaveCount(0);
  await expect(explorer.node("n.v.t")).toHaveCount(0);

  // A player of the team reads the draft and is offered no change.
  const player = await joinAsPlayer(browser, t.teamName, "Player Lindquasar");
  await player.goto(`/games/${t.game}/merrith/explore/n?edition=${t.edition}`);
  await expect(new ExplorerPage(player).node("n")).toBeVisible();
  await expect(player.getByTestId("draft-editor")).toHaveCount(0);
  await player.keyboard.press("f");
  await expect(player.getByRole("form", { name: /follow-up/ })).toHaveCount(0);
});

test("a coach fixes a number in place in the draft's move list; a save someone beat shows both values", async ({
  page,
}) => {
  const t = await teamGameWithMerrith(page);
  await page.goto(`/games/${t.game}/merrith?edition=${t.edition}`);
  const list = new MoveListPage(page);
  await list.openStringOf("v");
  const row = list.row("v");
  // From the keyboard: focus the cell's button, Enter opens it, Enter saves.
  await row.getByRole("button", { name: "Change the on block of v" }).focus();
  await page.keyboard.press("Enter");
  await row.getByLabel("The on block of v").fill("-9z");
  await page.keyboard.press("Enter");
  await expect(row.getByRole("alert")).toContainText("on block must be");
  await row.getByLabel("The on block of v").fill("-9");
  await page.keyboard.press("Enter");
  await expect(row.locator('[data-field="onBlock"]')).toContainText("-9");
  await expect(row.getByRole("button", { name: "Change the on block of v" })).toBeVisible();

  // The list was read at one version; someone saves the move; this coach's fix meets theirs.
  const url = `/api/games/${t.game}/editions/${t.edition}/characters/merrith/moves/v`;
  const now = (await (await page.request.get(url)).json()) as { version: number };
  await row.getByRole("button", { name: "Change the damage of v" }).click();
  expect((await page.request.patch(url, { data: { version: now.version, changes: { damage: 14 } } })).status()).toBe(
    200,
  );
  await row.getByLabel("The damage of v", { exact: true }).fill("12");
  await page.keyboard.press("Enter");
  const conflict = row.getByTestId("quick-fix-conflict");
  await expect(conflict).toContainText("theirs 14, yours 12");
  await conflict.getByRole("button", { name: "Save mine" }).click();
  await expect(row.getByRole("button", { name: "Change the damage of v" })).toContainText("12");
});
