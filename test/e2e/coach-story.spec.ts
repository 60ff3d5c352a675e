import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { expect, test } from "@playwright/test";
import { query } from "./db";
import { ExplorerPage } from "./pages/explorer-page";
import { ImportPage } from "./pages/import-page";
import { joinAsPlayer, signUpAs, TeamsPage } from "./pages/team-pages";

// The whole job of "bring your own game", as a coach does it in the browser: a game and a
// character made, the example file brought in (a bad row first, named by its line), a cancel
// added from the Explorer, the Edition published, the next one started and a number changed
// there, published too, and the change read in What changed; a player of the team reads it all
// and is offered no change.

test.describe.configure({ timeout: 240_000 });

test.beforeEach(async () => {
  await query("delete from rate_limits");
});

const tag = () => randomUUID().slice(0, 6);
const example = readFileSync(join(process.cwd(), "public/examples/merrith.csv"), "utf8");
/** A line's number as a text editor counts it: common practice, no source. */
const lineOf = (text: string, needle: string) => text.slice(0, text.indexOf(needle)).split(/\r\n|\r|\n/).length;

test("a coach brings a character in from a file, adds a cancel in the Explorer, publishes two Editions and reads what changed", async ({
  page,
  browser,
}) => {
  const teamName = `Pier Nine ${tag()}`;
  const gameName = `Lampwick ${tag()}`;
  await signUpAs(page, "Coach Quillon-9", `coach-${tag()}@example.test`, "/teams");
  await new TeamsPage(page).create(teamName);

  // A game and its first character.
  const start = page.getByRole("form", { name: "Start a game" });
  await start.getByLabel("Game name").fill(gameName);
  await start.getByLabel("First Edition").fill("0.9");
  await start.getByLabel("First Edition").press("Enter");
  await expect(page.getByRole("heading", { level: 1, name: gameName })).toBeVisible();
  const gameUrl = new URL(page.url()).pathname;
  const character = page.getByRole("form", { name: "Add a character" });
  await character.getByLabel("Name").fill("Merrith");
  await character.getByLabel("Name").press("Enter");
  await page.getByRole("link", { name: "Import Merrith into 0.9" }).click();

  // The example file with one bad row: the preview names its line and nothing is written.
  const upload = new ImportPage(page);
  const badRow = "move,v.n,v.n,Hook Lamp Jab,middle,";
  const bad = example.replace("move,v.n,v.n,Hook Lamp Jab,mid,", badRow);
  await upload.choose({ name: "merrith.csv", mimeType: "text/csv", buffer: Buffer.from(bad) });
  await expect(upload.problems.first()).toContainText(`line ${lineOf(bad, badRow)}`);
  await expect(upload.problems.first()).toContainText("middle");
  // Fixed, it previews what will be added, and writes it on Import.
  await upload.choose({ name: "merrith.csv", mimeType: "text/csv", buffer: Buffer.from(example) });
  await expect(upload.keys("Moves", "added").first()).toBeVisible();
  await upload.confirm("0.9");
  await expect(upload.done).toBeVisible();

  // A string in the Explorer; a cancel added from its first hit.
  const game = gameUrl.split("/").pop()!;
  await page.goto(`/games/${game}/merrith/explore/v?edition=0-9`);
  const explorer = new ExplorerPage(page);
  await explorer.select("v");
  await page.keyboard.press("c");
  const cancel = page.getByRole("form", { name: "A cancel from v" });
  await cancel.getByLabel("Into the stance").selectOption({ label: "Low Wick" });
  await cancel.getByLabel("Cancel input").fill("~sink");
  await cancel.getByLabel("On block", { exact: true }).fill("-4");
  await cancel.getByLabel("On hit", { exact: true }).fill("2");
  await cancel.getByLabel("On counter hit", { exact: true }).fill("2");
  await cancel.getByRole("button", { name: "Add cancel" }).click();
  await expect(page.getByTestId("draft-editor").getByRole("status")).toHaveText("Added the cancel v~sink>wick.");
  await expect(explorer.node("stance:wick")).toBeVisible();
  await expect(explorer.field("onBlock")).toContainText("-4");

  // Published, then the next Edition started, a number changed there, and published too.
  await page.goto(gameUrl);
  await page.getByRole("button", { name: "Publish…" }).click();
  await page.getByRole("button", { name: "Yes, publish 0.9" }).click();
  const next = page.getByRole("form", { name: "Start the next Edition" });
  await next.getByLabel("Name").fill("1.0");
  await next.getByRole("button", { name: "Start the draft" }).click();
  await expect(page.getByRole("heading", { name: "Publish 1.0" })).toBeVisible();
  await page.goto(`/games/${game}/merrith/explore/v?edition=1-0`);
  await explorer.select("v");
  await page.keyboard.press("e");
  const edit = page.getByRole("form", { name: "Edit v" });
  await edit.getByLabel("On block", { exact: true }).fill("-12");
  await edit.getByRole("button", { name: "Save move" }).click();
  await expect(page.getByTestId("draft-editor").getByRole("status")).toHaveText("Saved v.");
  await page.goto(gameUrl);
  await page.getByRole("button", { name: "Publish…" }).click();
  await page.getByRole("button", { name: "Yes, publish 1.0" }).click();
  await expect(page.getByRole("form", { name: "Start the next Edition" })).toBeVisible();

  // A player of the team reads what changed, and finds no way to change anything.
  const player = await joinAsPlayer(browser, teamName, "Player Kasimirix Oyelarune");
  await player.goto(`/games/${game}/merrith/changes?from=0-9&to=1-0`);
  await expect(player.getByTestId("changes-summary")).toContainText("1 move changed");
  const changed = player.getByTestId("changes-move").locator('[data-item="v"] [data-field="onBlock"]');
  await expect(changed).toContainText("-3");
  await expect(changed).toContainText("-12");
  await expect(player.getByTestId("changed-paths").locator("tbody tr").first()).toBeVisible();
  await player.goto(`/games/${game}/merrith/explore/v?edition=1-0`);
  await expect(new ExplorerPage(player).node("v")).toBeVisible();
  await expect(player.getByTestId("draft-editor")).toHaveCount(0);
  await player.goto(gameUrl);
  await expect(player.getByRole("heading", { name: "Edit this game" })).toHaveCount(0);
  await expect(player.getByRole("link", { name: /^Import / })).toHaveCount(0);
});
