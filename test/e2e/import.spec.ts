import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { expect, test, type Page } from "@playwright/test";
import { query } from "./db";
import { ImportPage, type PickedFile } from "./pages/import-page";
import { MoveListPage } from "./pages/move-list-page";
import { signUpAs } from "./pages/team-pages";

// A coach brings a character's frame data in from a file through the browser: the file is
// checked where it is (every bad row by its line, nothing sent), compared with the draft (what
// is added and changed, field by field), and written only on Import. A file over the limit is
// refused from its size without being sent; a player of the team is offered no import.

test.describe.configure({ timeout: 150_000 });

test.beforeEach(async () => {
  // Sign-up is rate limited per address, and every test comes from 127.0.0.1.
  await query("delete from rate_limits");
});

const example = readFileSync(join(process.cwd(), "public/examples/merrith.csv"), "utf8");
const csv = (text: string): PickedFile => ({ name: "merrith.csv", mimeType: "text/csv", buffer: Buffer.from(text) });
/** A line's number as a text editor counts it: common practice, no source. */
const lineOf = (text: string, needle: string) => text.slice(0, text.indexOf(needle)).split(/\r\n|\r|\n/).length;
/** The example's moves, one `move` row each (README, "Bring your own game"). */
const exampleMoves = example.split(/\r?\n/).filter((l) => l.startsWith("move,")).length;

/** A team with a coach and a player, and a game of its own: a published Edition 0.9 and the draft 1.0 with Merrith in it. */
async function teamGame(page: Page, playerPage: Page) {
  const tag = randomUUID().slice(0, 8);
  const coachEmail = `coach-${tag}@example.test`;
  const playerEmail = `player-${tag}@example.test`;
  await signUpAs(page, "Player Hallowren-8", coachEmail);
  await signUpAs(playerPage, "Player Idrivane", playerEmail);
  const gameSlug = `harbour-lights-${tag}`;
  await query("insert into teams (slug, name) values (?, ?)", [`dock-crew-${tag}`, `Dock Crew ${tag}`]);
  const [team] = await query<{ id: number }>("select id from teams where slug = ?", [`dock-crew-${tag}`]);
  for (const [email, role] of [
    [coachEmail, "coach"],
    [playerEmail, "player"],
  ])
    await query("insert into memberships (team_id, user_id, role) select ?, id, ? from users where email = ?", [
      team!.id,
      role,
      email,
    ]);
  await query("insert into games (slug, name, team_id) values (?, ?, ?)", [
    gameSlug,
    `Harbour Lights ${tag}`,
    team!.id,
  ]);
  const [game] = await query<{ id: number }>("select id from games where slug = ?", [gameSlug]);
  await query(
    "insert into editions (game_id, slug, name, released_on, status) values (?, '0-9', '0.9', '2026-09-01', 'published'), (?, '1-0', '1.0', '2026-11-01', 'draft')",
    [game!.id, game!.id],
  );
  await query("insert into characters (game_id, slug, name) values (?, 'merrith', 'Merrith')", [game!.id]);
  const moves = async () =>
    Number(
      (
        await query<{ n: number }>(
          `select count(*) as n from moves m join editions e on e.id = m.edition_id where e.game_id = ? and e.slug = '1-0'`,
          [game!.id],
        )
      )[0]!.n,
    );
  return { gameSlug, moves };
}

test("a coach checks a file, sees what it changes, imports it into the draft; a player gets no import", async ({
  page,
  browser,
}) => {
  const playerPage = await (await browser.newContext()).newPage();
  const { gameSlug, moves } = await teamGame(page, playerPage);
  const importPage = new ImportPage(page);
  const uploads: string[] = [];
  page.on("request", (r) => {
    if (r.url().includes("/import") && r.method() === "POST") uploads.push(r.url());
  });

  // The move list of the draft offers the import to a coach.
  await page.goto(`/games/${gameSlug}/merrith`);
  await page.getByRole("link", { name: "Import Merrith from a file into 1.0 →" }).click();
  await expect(importPage.heading).toHaveText("Import Merrith’s frame data");

  // One unknown level: the browser names its line and what to write instead, and sends nothing.
  const bad = example.replace("Hook Lamp,high,", "Hook Lamp,overhead,");
  await importPage.choose(csv(bad));
  await expect(importPage.refusal).toBeVisible();
  await expect(importPage.problems).toHaveText([
    `line ${lineOf(bad, "Hook Lamp,overhead")}, column level: unknown level "overhead"; use one of high, mid, low, special-mid, throw, unblockable`,
  ]);
  expect(uploads).toEqual([]);

  // A file for another character passes the browser's check; the server's preview refuses it.
  await importPage.choose(csv(example.replace("character,merrith,", "character,someone-else,")));
  await expect(importPage.problems).toHaveText([/the file is for the character "someone-else", not "merrith"/]);
  expect(uploads).toHaveLength(1);
  expect(await moves()).toBe(0);

  // The fixed file, chosen with the keyboard: the preview lists what would be added, nothing is written yet.
  await importPage.chooseWithKeyboard(csv(example));
  await expect(importPage.preview).toBeVisible();
  await expect(importPage.preview.getByRole("status")).toContainText(`${exampleMoves} moves, 2 stances and`);
  await expect(importPage.keys("Moves", "added")).toHaveCount(exampleMoves);
  await expect(importPage.keys("Moves", "added").filter({ hasText: /^lantern:n\.v$/ })).toHaveCount(1);
  await expect(importPage.keys("Stances", "added")).toHaveText(["lantern", "wick"]);
  expect(uploads.every((u) => u.endsWith("?preview=1"))).toBe(true);
  expect(await moves()).toBe(0);

  const { default: AxeBuilder } = await import("@axe-core/playwright");
  const results = await new AxeBuilder({ page }).analyze();
  const serious = results.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(serious.map((v) => `${v.id}: ${v.nodes[0]?.target.join(" ")}`)).toEqual([]);

  await importPage.confirm("1.0");
  await expect(importPage.done).toBeVisible();
  await expect(importPage.done.getByRole("status")).toContainText(`${exampleMoves} moves`);
  expect(await moves()).toBe(exampleMoves);
  await importPage.done.getByRole("link", { name: "Open Merrith’s moves in 1.0 →" }).click();
  const list = new MoveListPage(page);
  await expect(list.heading).toHaveText("Merrith");
  await list.openAll();
  await expect(list.rows).toHaveCount(exampleMoves);
  await expect(list.row("lantern:v")).toContainText("Lantern Swing");

  // A second file changes one move: the preview says which field, from what to what.
  await importPage.goto(gameSlug, "merrith");
  await importPage.choose(csv(example.replace("Spark Jab,high,7,", "Spark Jab,high,9,")));
  await expect(importPage.keys("Moves", "changed")).toHaveCount(1);
  await expect(importPage.keys("Moves", "changed").first()).toContainText("damage");
  await expect(importPage.keys("Moves", "changed").first()).toContainText("7 → 9");
  await expect(importPage.keys("Moves", "added")).toHaveCount(0);

  // The published Edition is frozen: the page says where to go instead.
  await importPage.goto(gameSlug, "merrith", "0-9");
  await expect(page.getByRole("status")).toContainText("0.9 is published");
  await expect(page.getByRole("status").getByRole("link", { name: /page/ })).toHaveAttribute(
    "href",
    `/games/${gameSlug}`,
  );
  await expect(importPage.dropzone).toHaveCount(0);

  // A player reads the draft's moves with no import link, and the import page says why not.
  await playerPage.goto(`/games/${gameSlug}/merrith`);
  const playerList = new MoveListPage(playerPage);
  await playerList.openAll();
  await expect(playerList.rows).toHaveCount(exampleMoves);
  await expect(playerPage.getByRole("link", { name: /^Import / })).toHaveCount(0);
  await new ImportPage(playerPage).goto(gameSlug, "merrith");
  await expect(playerPage.getByRole("status")).toContainText("needs the coach role or higher; you are a player");
  await expect(new ImportPage(playerPage).dropzone).toHaveCount(0);
  await playerPage.close();
});

test("a file over 10 MB is refused from its size without being sent; a large one is read behind a progress bar", async ({
  page,
  browser,
}) => {
  const playerPage = await (await browser.newContext()).newPage();
  const { gameSlug, moves } = await teamGame(page, playerPage);
  await playerPage.close();
  const uploads: string[] = [];
  page.on("request", (r) => {
    if (r.method() === "POST" && r.url().includes("/import")) uploads.push(r.url());
  });
  const importPage = new ImportPage(page);
  await importPage.goto(gameSlug, "merrith");
  await importPage.choose({
    name: "everyone.csv",
    mimeType: "text/csv",
    buffer: Buffer.concat([Buffer.from(example), Buffer.alloc(11 * 1024 * 1024 - example.length, "\n")]),
  });
  await expect(importPage.problems).toHaveText([
    "the file is 11.0 MB; the limit is 10.0 MB. Split the Edition into one file per character",
  ]);
  await expect(importPage.progress).toHaveCount(0);
  expect(uploads).toEqual([]);
  expect(await moves()).toBe(0);

  // A large file under the limit is read in chunks behind a progress bar, and a bad row at its end is found by its line.
  await page.evaluate(() => {
    const seen: string[] = [];
    (window as unknown as { progressSeen: string[] }).progressSeen = seen;
    new MutationObserver(() => {
      const bar = document.querySelector('[role="progressbar"]');
      const now = bar?.getAttribute("aria-valuenow");
      if (now && seen.at(-1) !== now) seen.push(now);
    }).observe(document.body, { subtree: true, childList: true, attributes: true });
  });
  const badRow = "move,zz,zz,Late Mistake,overhead,10,12,-3,6,6,,,standing,,,,,,,,,";
  const large = `${example}${"\r\n".repeat(3_000_000)}${badRow}\r\n`;
  await importPage.choose(csv(large));
  await expect(importPage.problems).toHaveText([/^line 3000025, column level: unknown level "overhead"/], {
    timeout: 30_000,
  });
  expect(lineOf(large, badRow)).toBe(3_000_025);
  const seen = (await page.evaluate(() => (window as unknown as { progressSeen: string[] }).progressSeen)).map(Number);
  expect(seen.some((v) => v > 0 && v < 100)).toBe(true);
  expect(seen).toEqual([...seen].sort((a, b) => a - b));
  expect(uploads).toEqual([]);

  // The next file is checked as usual.
  await importPage.choose(csv(example));
  await expect(importPage.preview).toBeVisible();
});
