import { randomUUID } from "node:crypto";
import { expect, test, type Page } from "@playwright/test";
import { query } from "./db";
import { signUpAs } from "./pages/team-pages";

// The "What changed" page. The demo's two Editions differ (src/server/db/seed/demo.ts): in 1-1
// Quessaline's r.r follows r with no gap and combos on hit, so the paths through it become natural
// combos that jail; Tarrow's sink+r ends at -13 instead of -12.

const quessaline = "/games/vesper-circuit/quessaline";

const pathRows = (page: Page) => page.getByTestId("changed-paths").locator("tbody tr");

test("a player reads what 1-1 changed for Quessaline, sorts and filters the paths, and opens one in the Explorer", async ({
  page,
}) => {
  await page.goto(quessaline);
  await page.getByRole("link", { name: /What changed for Quessaline in 1\.1/ }).click();
  await expect(page).toHaveURL(/\/quessaline\/changes\?to=1-1$/);
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
  await expect(link).toContainText("r.r");
  await expect(link.locator('[data-field="gapOnBlock"]')).toContainText("3");
  await expect(link.locator('[data-field="gapOnBlock"]')).toContainText("0");
  await expect(link.locator('[data-field="comboOnHit"]')).toContainText(/no\s*→?\s*becomes\s*yes|no.*yes/);

  const rows = pathRows(page);
  const count = await rows.count();
  expect(count).toBeGreaterThan(1);
  const inputs = () => rows.locator('td[data-field="input"]').allInnerTexts();
  const initial = await inputs();
  // Sorting by input, then the other way round: the server sorts, and the address keeps it.
  const sortInput = page.getByRole("button", { name: /^Input/ });
  const inputHeading = page.getByRole("columnheader", { name: /Input/ });
  await sortInput.click();
  await expect(inputHeading).toHaveAttribute("aria-sort", "ascending");
  await expect(page).toHaveURL(/sort=input/);
  const asc = await inputs();
  await sortInput.click();
  await expect(inputHeading).toHaveAttribute("aria-sort", "descending");
  await expect(page).toHaveURL(/sort=input&dir=desc/);
  const desc = await inputs();
  expect(desc).toEqual([...asc].reverse());
  expect([...asc].sort()).toEqual([...initial].sort());

  // Filtering by text: only r.r itself.
  const search = page.getByRole("searchbox", { name: "Input contains" });
  await search.fill("r.r~");
  await expect(page).toHaveURL(/q=r.r%7E|q=r.r~/);
  await expect(rows.first()).toBeVisible();
  for (const text of await inputs()) expect(text).toContain("r.r~");
  await search.fill("");
  await expect(page).not.toHaveURL(/q=/);
  await expect(rows).toHaveCount(count);
  // Filtering by kind of change: nothing was added for Quessaline.
  await page.getByRole("combobox", { name: "Change" }).selectOption("added");
  await expect(page.getByText("No changed path matches these filters.")).toBeVisible();
  await page.getByRole("button", { name: "Clear filters" }).first().click();
  await expect(rows).toHaveCount(count);

  // The row for r.r opens that path in the Explorer, in 1-1.
  await search.fill("r.r");
  await expect(page).toHaveURL(/q=r.r(&|$)/);
  const row = rows.filter({ has: page.locator('td[data-field="input"]', { hasText: /^r.r$/ }) });
  await expect(row.locator('td[data-field="naturalCombo"]')).toContainText(/no.*yes/);
  await row.getByRole("link", { name: "r.r", exact: true }).click();
  await expect(page).toHaveURL(/\/quessaline\/explore\/r\?edition=1-1&path=/);
  await expect(page.getByTestId("path-card").locator('[data-field="input"]').first()).toHaveText("r.r");
});

test("the picker compares any two Editions, and the same Edition on both sides says so", async ({ page }) => {
  await page.goto("/games/vesper-circuit/tarrow/changes");
  await expect(page.getByTestId("changes-summary")).toContainText("1 move changed");
  await expect(page.getByTestId("changes-move")).toContainText("sink+r");
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

test.describe("a patch that changes hundreds of paths", () => {
  // A string 1 with 24 follow-ups, each with the same 24 follow-ups: 600 paths from 1. In 0.2
  // every first follow-up stops combo-ing on hit (each path loses its natural combo), and the
  // follow-up ,7 ends at -13 instead of -5 (24 paths now punishable). 600 changed paths: two pages.
  const tag = randomUUID().slice(0, 8);
  const game = `pages-game-${tag}`;
  const member = { name: `Pager ${tag}`, email: `changes-pager-${tag}@example.test` };
  const address = `/games/${game}/abacus/changes`;

  test.beforeAll(async () => {
    await query("delete from rate_limits");
    await query("insert into teams (slug, name) values (?, ?)", [`pages-team-${tag}`, `Pages team ${tag}`]);
    const [team] = await query<{ id: number }>("select id from teams where slug = ?", [`pages-team-${tag}`]);
    await query("insert into games (slug, name, team_id) values (?, ?, ?)", [game, `Pages ${tag}`, team!.id]);
    const [g] = await query<{ id: number }>("select id from games where slug = ?", [game]);
    await query("insert into characters (game_id, slug, name) values (?, 'abacus', 'Abacus')", [g!.id]);
    const [c] = await query<{ id: number }>("select id from characters where game_id = ?", [g!.id]);
    for (const slug of ["0-1", "0-2"]) {
      const patched = slug === "0-2";
      await query("insert into editions (game_id, slug, name, released_on) values (?, ?, ?, ?)", [
        g!.id,
        slug,
        slug.replace("-", "."),
        patched ? "2026-10-01" : "2026-09-01",
      ]);
      const [e] = await query<{ id: number }>("select id from editions where game_id = ? and slug = ?", [g!.id, slug]);
      const move = (key: string, input: string, onBlock: number) => [
        e!.id,
        c!.id,
        key,
        input,
        "mid",
        10,
        12,
        String(onBlock),
        "3",
        "5",
        "[]",
      ];
      const moveRows = [move("1", "1", -5)];
      for (let i = 1; i <= 24; i++)
        moveRows.push(move(`a${i}`, `1,${i}`, -5), move(`b${i}`, `${i}`, i === 7 && patched ? -13 : -5));
      await query(
        "insert into moves (edition_id, character_id, `key`, input, name, level, damage, startup, on_block, on_hit, on_counter_hit, tags) values " +
          moveRows.map(() => "(?, ?, ?, ?, 'Bead', ?, ?, ?, ?, ?, ?, ?)").join(", "),
        moveRows.flat(),
      );
      const ids = new Map(
        (await query<{ id: number; key: string }>("select id, `key` from moves where edition_id = ?", [e!.id])).map(
          (m) => [m.key, m.id],
        ),
      );
      const follow = (from: string, to: string, input: string, combo: boolean) => [
        e!.id,
        c!.id,
        `${from}>${to}`,
        ids.get(from),
        ids.get(to),
        input,
        combo,
      ];
      const edgeRows = [];
      for (let i = 1; i <= 24; i++) {
        edgeRows.push(follow("1", `a${i}`, `,${i}`, !patched));
        for (let j = 1; j <= 24; j++) edgeRows.push(follow(`a${i}`, `b${j}`, `,${j}`, true));
      }
      await query(
        "insert into edges (edition_id, character_id, `key`, kind, from_move_id, to_move_id, input, gap_on_block, combo_on_hit, combo_on_counter_hit) values " +
          edgeRows.map(() => "(?, ?, ?, 'follow', ?, ?, ?, 0, ?, 1)").join(", "),
        edgeRows.flat(),
      );
      await query("update editions set status = 'published' where id = ?", [e!.id]);
    }
  });

  test("sorting and filtering reach every page, and the address keeps the view", async ({ browser }) => {
    test.setTimeout(150_000);
    const page = await (await browser.newContext()).newPage();
    await signUpAs(page, member.name, member.email);
    const [team] = await query<{ id: number }>("select id from teams where slug = ?", [`pages-team-${tag}`]);
    const [user] = await query<{ id: string }>("select id from users where email = ?", [member.email]);
    await query("insert into memberships (team_id, user_id, role) values (?, ?, 'viewer')", [team!.id, user!.id]);

    await page.goto(address);
    const rows = pathRows(page);
    const inputs = () => rows.locator('td[data-field="input"]').allInnerTexts();
    const count = page.getByTestId("changed-paths-count");
    await expect(count).toContainText("600 of 600 paths");
    await expect(rows).toHaveCount(500);
    await expect(page.getByRole("navigation", { name: "Pages of changed paths" })).toContainText("Page 1 of 2");
    // The paths after 1,9 come last in input order: none is on the first page.
    expect((await inputs()).filter((i) => i.startsWith("1,9,"))).toEqual([]);

    // A filter finds them all the same.
    await page.getByRole("searchbox", { name: "Input contains" }).fill("1,9,");
    await expect(count).toContainText("24 of 600 paths");
    expect((await inputs()).every((i) => i.startsWith("1,9,"))).toBe(true);
    await expect(rows).toHaveCount(24);

    // By kind of change: the 24 endings that became punishable, from every page.
    await page.getByRole("button", { name: "Clear filters" }).first().click();
    await expect(count).toContainText("600 of 600 paths");
    await page.getByRole("combobox", { name: "Change" }).selectOption("blockClass");
    await expect(count).toContainText("24 of 600 paths");
    expect(await inputs()).toContain("1,9,7");
    for (const cell of await rows.locator('td[data-field="blockClass"]').allInnerTexts()) {
      expect(cell.split("\n").map((w) => w.trim())).toEqual(["safe", "→", "becomes", "punishable"]);
    }
    await page.getByRole("combobox", { name: "Change" }).selectOption("naturalCombo");
    await expect(count).toContainText("600 of 600 paths");
    await page.getByRole("combobox", { name: "Change" }).selectOption("any");

    // Sorting puts the last path of page 2 first, and a reload keeps the view.
    await page.getByRole("button", { name: /^Input/ }).click();
    await page.getByRole("button", { name: /^Input/ }).click();
    await expect(page.getByRole("columnheader", { name: /Input/ })).toHaveAttribute("aria-sort", "descending");
    await expect(rows.first().locator('td[data-field="input"]')).toHaveText("1,9,9");
    await page.reload();
    await expect(page.getByRole("columnheader", { name: /Input/ })).toHaveAttribute("aria-sort", "descending");
    await expect(rows.first().locator('td[data-field="input"]')).toHaveText("1,9,9");
    await page.getByRole("link", { name: "Next page" }).click();
    await expect(page).toHaveURL(/sort=input&dir=desc&page=2/);
    await expect(rows).toHaveCount(100);
    await expect(rows.last().locator('td[data-field="input"]')).toHaveText("1,1");

    // Each row still opens its path in the Explorer of either Edition.
    await expect(rows.last().getByRole("link", { name: "1,1 in 0.1" })).toHaveAttribute(
      "href",
      /\/abacus\/explore\/1\?edition=0-1&path=1%3Ea1$/,
    );
  });
});
