import { randomUUID } from "node:crypto";
import { expect, test, type Page } from "@playwright/test";
import { query } from "./db";
import { signUpAs } from "./pages/team-pages";

// The "What changed" page. The demo's two Editions differ (src/server/db/seed/demo.ts): in 1-1
// Velka's 4,4 follows 4 with no gap and combos on hit, so the paths through it become natural
// combos that jail; Tarrow's d+4 ends at -13 instead of -12.

const velka = "/games/vesper-circuit/velka";

const pathRows = (page: Page) => page.getByTestId("changed-paths").locator("tbody tr");

test("a player reads what 1-1 changed for Velka, sorts and filters the paths, and opens one in the Explorer", async ({
  page,
}) => {
  await page.goto(velka);
  await page.getByRole("link", { name: /What changed for Velka in 1\.1/ }).click();
  await expect(page).toHaveURL(/\/velka\/changes\?to=1-1$/);
  await expect(page.getByRole("heading", { level: 1 })).toContainText("What changed");
  // Defaults: the Edition shown, compared with the one before it.
  await expect(page.getByRole("combobox", { name: "From Edition" })).toHaveValue("1-0");
  await expect(page.getByRole("combobox", { name: "To Edition" })).toHaveValue("1-1");

  const summary = page.getByTestId("changes-summary");
  await expect(summary).toContainText("1 follow-up or cancel changed");
  await expect(summary).toContainText(/natural combos? gained/);
  await expect(summary).toContainText(/now jails?/);

  // On a phone the table scrolls in its own box; the page itself never scrolls sideways.
  expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBe(
    0,
  );

  // The link itself, field by field.
  const link = page.getByTestId("changes-link").locator("li").first();
  await expect(link).toContainText("4,4");
  await expect(link.locator('[data-field="gapOnBlock"]')).toContainText("3");
  await expect(link.locator('[data-field="gapOnBlock"]')).toContainText("0");
  await expect(link.locator('[data-field="comboOnHit"]')).toContainText(/no\s*→?\s*becomes\s*yes|no.*yes/);

  const rows = pathRows(page);
  const count = await rows.count();
  expect(count).toBeGreaterThan(1);
  const inputs = () => rows.locator('td[data-field="input"]').allInnerTexts();
  const initial = await inputs();
  // Sorting by input, then the other way round.
  const sortInput = page.getByRole("button", { name: /^Input/ });
  await sortInput.click();
  const asc = await inputs();
  await sortInput.click();
  const desc = await inputs();
  expect(desc).toEqual([...asc].reverse());
  expect([...asc].sort()).toEqual([...initial].sort());
  await expect(page.getByRole("columnheader", { name: /Input/ })).toHaveAttribute("aria-sort", "descending");

  // Filtering by text: only 4,4 itself.
  await page.getByRole("searchbox", { name: "Input contains" }).fill("4,4~");
  for (const text of await inputs()) expect(text).toContain("4,4~");
  await page.getByRole("searchbox", { name: "Input contains" }).fill("");
  // Filtering by status: nothing was added for Velka.
  await page.getByRole("combobox", { name: "Status" }).selectOption("added");
  await expect(page.getByText("No changed path matches these filters.")).toBeVisible();
  await page.getByRole("button", { name: "Clear filters" }).first().click();
  await expect(rows).toHaveCount(count);

  // The row for 4,4 opens that path in the Explorer, in 1-1.
  await page.getByRole("searchbox", { name: "Input contains" }).fill("4,4");
  const row = rows.filter({ has: page.locator('td[data-field="input"]', { hasText: /^4,4$/ }) });
  await expect(row.locator('td[data-field="naturalCombo"]')).toContainText(/no.*yes/);
  await row.getByRole("link", { name: "4,4", exact: true }).click();
  await expect(page).toHaveURL(/\/velka\/explore\/4\?edition=1-1&path=/);
  await expect(page.getByTestId("path-card").locator('[data-field="input"]').first()).toHaveText("4,4");
});

test("the picker compares any two Editions, and the same Edition on both sides says so", async ({ page }) => {
  await page.goto("/games/vesper-circuit/tarrow/changes");
  await expect(page.getByTestId("changes-summary")).toContainText("1 move changed");
  await expect(page.getByTestId("changes-move")).toContainText("d+4");
  await expect(page.getByTestId("changes-move").locator('[data-field="onBlock"]')).toContainText(/-12.*-13/);

  await page.getByRole("combobox", { name: "From Edition" }).selectOption("1-1");
  await page.getByRole("button", { name: "Compare" }).click();
  await expect(page).toHaveURL(/from=1-1&to=1-1/);
  await expect(page.getByRole("status").filter({ hasText: "pick two different Editions" })).toBeVisible();

  // Backwards works too: what going back to 1-0 would undo.
  await page.goto("/games/vesper-circuit/tarrow/changes?from=1-1&to=1-0");
  await expect(page.getByTestId("changes-move").locator('[data-field="onBlock"]')).toContainText(/-13.*-12/);
});

test.describe("a team's game", () => {
  const tag = randomUUID().slice(0, 8);
  const game = `changes-game-${tag}`;
  const secret = `Hushed Cartographer ${tag}`;
  const member = { name: `Member ${tag}`, email: `changes-member-${tag}@example.test` };
  const outsider = { name: `Outsider ${tag}`, email: `changes-outsider-${tag}@example.test` };
  const address = `/games/${game}/cartographer/changes`;

  test.beforeAll(async () => {
    await query("delete from rate_limits");
  });

  test("its members compare a draft; outsiders and signed-out visitors get the same 404 as an unknown game", async ({
    browser,
  }) => {
    test.setTimeout(90_000);
    const memberPage = await (await browser.newContext()).newPage();
    const outsiderPage = await (await browser.newContext()).newPage();
    await signUpAs(memberPage, member.name, member.email);
    await signUpAs(outsiderPage, outsider.name, outsider.email);

    await query("insert into teams (slug, name) values (?, ?)", [`changes-team-${tag}`, `Changes team ${tag}`]);
    const [team] = await query<{ id: number }>("select id from teams where slug = ?", [`changes-team-${tag}`]);
    const [user] = await query<{ id: string }>("select id from users where email = ?", [member.email]);
    await query("insert into memberships (team_id, user_id, role) values (?, ?, 'viewer')", [team!.id, user!.id]);
    await query("insert into games (slug, name, team_id) values (?, ?, ?)", [game, `Private ${tag}`, team!.id]);
    const [g] = await query<{ id: number }>("select id from games where slug = ?", [game]);
    await query("insert into characters (game_id, slug, name) values (?, 'cartographer', ?)", [g!.id, secret]);
    const [c] = await query<{ id: number }>("select id from characters where game_id = ?", [g!.id]);
    for (const [slug, onBlock] of [
      ["0-1", "-8"],
      ["0-2", "-11"],
    ] as const) {
      await query("insert into editions (game_id, slug, name, released_on) values (?, ?, ?, ?)", [
        g!.id,
        slug,
        slug.replace("-", "."),
        slug === "0-1" ? "2026-09-01" : "2026-10-01",
      ]);
      const [e] = await query<{ id: number }>("select id from editions where game_id = ? and slug = ?", [g!.id, slug]);
      await query(
        `insert into moves (edition_id, character_id, \`key\`, input, name, level, damage, startup, on_block, on_hit, on_counter_hit, tags)
         values (?, ?, 'f+2', 'f+2', 'Chart Strike', 'mid', 12, 14, ?, '3', '5', '[]')`,
        [e!.id, c!.id, onBlock],
      );
      if (slug === "0-1") await query("update editions set status = 'published' where id = ?", [e!.id]);
    }

    // The member: 0.1 (published) against the 0.2 draft.
    await memberPage.goto(address);
    await expect(memberPage.getByRole("combobox", { name: "To Edition" })).toHaveValue("0-2");
    await expect(memberPage.getByRole("combobox", { name: "To Edition" })).toContainText("0.2 (draft)");
    await expect(memberPage.getByTestId("changes-summary")).toContainText("1 ending that was safe is now punishable");

    for (const visitor of [outsiderPage, await (await browser.newContext()).newPage()]) {
      const res = await visitor.goto(address);
      expect(res?.status()).toBe(404);
      expect(await visitor.content()).not.toContain(secret);
      const unknown = await visitor.goto(`/games/no-such-game-${tag}/cartographer/changes`);
      expect(unknown?.status()).toBe(404);
    }
  });
});
