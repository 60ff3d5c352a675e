import { expect, test, type Page } from "@playwright/test";
import { query } from "./db";
import { MoveListPage } from "./pages/move-list-page";

const signed = (n: number) => (n > 0 ? `+${n}` : String(n));
/** An outcome as MariaDB holds it (JSON), written as the list writes it: `-3`, `knockdown`, `knockdown +2`. */
const outcome = (json: unknown) => {
  const v = (typeof json === "string" ? JSON.parse(json) : json) as number | { state: string; frames?: number };
  if (typeof v === "number") return signed(v);
  return v.frames === undefined ? v.state : `${v.state} ${signed(v.frames)}`;
};

interface MoveRow {
  key: string;
  name: string;
  level: string;
  damage: number;
  startup: number | null;
  on_block: string;
  on_hit: string;
  on_counter_hit: string;
  range: string | null;
  tags: string | string[] | null;
  notes: string | null;
}

/** A JSON list column as mysql2 hands it over: already read, or as text. */
const listOf = (v: string | string[] | null): string[] =>
  v === null ? [] : Array.isArray(v) ? v : (JSON.parse(v) as string[]);

async function movesOf(character: string, edition: string) {
  return query<MoveRow>(
    `select m.\`key\`, m.name, m.level, m.damage, m.startup, m.on_block, m.on_hit, m.on_counter_hit, m.\`range\`, m.tags, m.notes
       from moves m
       join characters c on c.id = m.character_id
       join editions e on e.id = m.edition_id
       join games gm on gm.id = c.game_id
     where gm.slug = 'vesper-circuit' and c.slug = ? and e.slug = ? order by m.sort`,
    [character, edition],
  );
}

async function cancelsOf(character: string, edition: string) {
  return query<{
    key: string;
    on_block: string;
    on_hit: string;
    on_counter_hit: string;
    auto_guard: string | string[] | null;
  }>(
    `select g.\`key\`, g.on_block, g.on_hit, g.on_counter_hit, g.auto_guard from edges g
       join characters c on c.id = g.character_id
       join editions e on e.id = g.edition_id
       join games gm on gm.id = c.game_id
     where gm.slug = 'vesper-circuit' and c.slug = ? and e.slug = ? and g.kind = 'cancel'`,
    [character, edition],
  );
}

/** What a step row shows to the eye: each figure's visible text (innerText leaves hidden copies out). */
async function shownSteps(page: Page, selector: string) {
  return page.locator(selector).evaluateAll((rows) =>
    rows.map((row) => {
      const visible = (field: string) =>
        [...row.querySelectorAll<HTMLElement>(`[data-field="${field}"]`)]
          .filter((e) => e.checkVisibility())
          .map((e) => e.innerText.trim());
      return {
        key: row.getAttribute("data-move-key") ?? row.getAttribute("data-cancel-key"),
        visible: (row as HTMLElement).checkVisibility(),
        text: (row as HTMLElement).innerText,
        level: row.querySelector("[data-level]")?.getAttribute("data-level") ?? null,
        onBlock: visible("onBlock"),
        onHit: visible("onHit"),
        onCounterHit: visible("onCounterHit"),
        damage: visible("damage"),
        startup: visible("startup"),
      };
    }),
  );
}

async function expectNoSeriousAxe(page: Page, where: string) {
  const { default: AxeBuilder } = await import("@axe-core/playwright");
  const results = await new AxeBuilder({ page }).analyze();
  const bad = results.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(bad.map((v) => `${where} ${v.id}: ${v.nodes.length} node(s), e.g. ${v.nodes[0]?.target.join(" ")}`)).toEqual(
    [],
  );
}

test("a visitor goes from the landing page to a character's move list read from MariaDB", async ({ page }) => {
  const errors: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error") errors.push(m.text());
  });

  await page.goto("/");
  await expect(page.getByRole("heading", { level: 1 })).toContainText("every string");
  // Every promise of the landing page has its screen now: nothing is marked as coming.
  await expect(page.getByRole("listitem").filter({ hasText: "Mix-up boards" })).toBeVisible();
  await expect(page.getByRole("listitem").filter({ hasText: "coming" })).toHaveCount(0);
  await page.getByRole("link", { name: "Browse games" }).click();

  await expect(page).toHaveURL(/\/games$/);
  await page.getByRole("link", { name: /Vesper Circuit/ }).click();

  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Vesper Circuit");
  await page.getByRole("link", { name: /Tarrow/ }).click();

  const list = new MoveListPage(page);
  await expect(list.heading).toHaveText("Tarrow");

  // Every move of the newest edition is a step of one string, and every cancel one too.
  const expected = await movesOf("tarrow", "1-1");
  const cancels = await cancelsOf("tarrow", "1-1");
  expect(expected.length).toBeGreaterThanOrEqual(25);
  // Closed, a string is one row and its steps are not in the page: far fewer rows than moves.
  await expect(list.strings.first()).toBeVisible();
  const strings = await list.strings.count();
  expect(strings).toBeLessThan(expected.length);
  await expect(list.rows).toHaveCount(0);

  // Opened, every move of the edition is a step of one string, and every cancel one too.
  await list.openAll();
  await expect(list.rows).toHaveCount(expected.length);
  await expect(list.cancelRows).toHaveCount(cancels.length);
  const shownKeys = await list.rows.evaluateAll((rows) => rows.map((r) => r.getAttribute("data-move-key")));
  expect([...shownKeys].sort()).toEqual(expected.map((m) => m.key).sort());

  // Every figure MariaDB holds for a move shows in its step.
  const steps = new Map((await shownSteps(page, "tr[data-move-key]")).map((s) => [s.key, s]));
  for (const m of expected) {
    const s = steps.get(m.key);
    expect(s, m.key).toBeDefined();
    expect(s?.visible, m.key).toBe(true);
    expect([s?.key, s?.onBlock, s?.onHit, s?.onCounterHit]).toEqual([
      m.key,
      [outcome(m.on_block)],
      [outcome(m.on_hit)],
      [outcome(m.on_counter_hit)],
    ]);
    expect([m.key, s?.level, s?.damage, s?.startup]).toEqual([
      m.key,
      m.level,
      [String(m.damage)],
      [m.startup === null ? "—" : String(m.startup)],
    ]);
    for (const word of [m.name, m.range, m.notes, ...listOf(m.tags)].filter((w): w is string => !!w)) {
      expect(s?.text, `${m.key}: ${word}`).toContain(word);
    }
  }
  // And every cancel: its three outcomes and its auto-guard.
  const cancelSteps = new Map((await shownSteps(page, "tr[data-cancel-key]")).map((s) => [s.key, s]));
  for (const c of cancels) {
    const s = cancelSteps.get(c.key);
    expect([c.key, s?.visible, s?.onBlock, s?.onHit, s?.onCounterHit]).toEqual([
      c.key,
      true,
      [outcome(c.on_block)],
      [outcome(c.on_hit)],
      [outcome(c.on_counter_hit)],
    ]);
    for (const level of listOf(c.auto_guard)) expect(s?.text).toContain(level);
  }
  expect(errors).toEqual([]);
});

test("a string reads as its start, its levels and how it ends; each step shows only what it adds", async ({ page }) => {
  const list = new MoveListPage(page);
  await page.goto("/games/vesper-circuit/tarrow");
  // Tarrow's n (demo data): n +1; -v -3; -n -4; -t -8; -r -13; ~ebb into Drift -1 (fastest attack 11).
  const one = list.string("n");
  await expect(one.locator('[data-field="levels"] [data-level]')).toHaveCount(3);
  await expect(one.locator('[data-field="endings"] li')).toHaveText([
    "1 plus",
    "3 safe",
    "1 safe via cancel",
    "1 punishable",
  ]);
  await list.open("n");
  await expect(list.row("n.v").getByRole("rowheader")).toContainText(".v");
  await expect(list.row("n.v").getByRole("rowheader")).not.toContainText("n.v");
  await expect(list.row("n.v").getByRole("rowheader")).toContainText("guess point");
  await expect(list.row("n.v.r").locator('[data-field="gapOnBlock"]')).toHaveText("gap 5");
  await expect(list.row("n.v").locator('[data-field="gapOnBlock"]')).toHaveText("jail · combo");
  const cancel = page.locator('tr[data-cancel-key="n.v~ebb>drift"]');
  await expect(cancel.getByRole("rowheader")).toContainText("~ebb");
  await expect(cancel.locator('[data-field="framesSaved"]')).toHaveText("saves 2f");
  // The button says whether the string is open, and closes it again from the keyboard.
  const button = one.getByRole("button", { name: "Steps of n" });
  await expect(button).toHaveAttribute("aria-expanded", "true");
  await button.focus();
  await page.keyboard.press("Enter");
  await expect(button).toHaveAttribute("aria-expanded", "false");
  await expect(list.row("n.v")).toBeHidden();
});

test("switching the edition shows that edition's frame data", async ({ page }) => {
  const list = new MoveListPage(page);
  await page.goto("/games/vesper-circuit/tarrow");
  const [newer] = (await movesOf("tarrow", "1-1")).filter((m) => m.key === "sink+r");
  const [older] = (await movesOf("tarrow", "1-0")).filter((m) => m.key === "sink+r");
  expect(newer?.on_block).not.toEqual(older?.on_block);

  await list.open("sink+r");
  await expect(list.field("sink+r", "onBlock")).toHaveText(signed(Number(newer?.on_block)));
  await list.chooseEdition("1.0 Launch");
  await expect(page).toHaveURL(/edition=1-0/);
  await list.open("sink+r");
  await expect(list.field("sink+r", "onBlock")).toHaveText(signed(Number(older?.on_block)));
});

test("filters and the order live in the address, survive a reload, and an empty result offers the way back", async ({
  page,
}) => {
  const list = new MoveListPage(page);
  await page.goto("/games/vesper-circuit/tarrow?edition=1-1");
  const all = await list.strings.count();
  // What each filter should keep, read from the whole list first (its steps show when open).
  await list.openAll();
  const withLow = await page
    .locator('tbody:has(tr[data-move-key] [data-level="low"])')
    .evaluateAll((t) => t.map((b) => b.getAttribute("data-string")));
  const withPunishable = await page
    .locator('tbody:has([data-field="endings"] [data-block-class="punishable"])')
    .evaluateAll((t) => t.map((b) => b.getAttribute("data-string")));
  expect(withLow.length).toBeGreaterThan(0);
  expect(withLow.length).toBeLessThan(all);
  const shownStrings = () => list.strings.evaluateAll((r) => r.map((x) => x.getAttribute("data-string-key")));

  await list.filters.getByLabel("A hit that is").selectOption("low");
  await expect(page).toHaveURL(/level=low/);
  await expect(page).toHaveURL(/edition=1-1/);
  await expect(list.strings).toHaveCount(withLow.length);
  expect(await shownStrings()).toEqual(withLow);
  await expect(list.count).toContainText(`${withLow.length} of ${all}`);

  await list.filters.getByLabel("A hit that is").selectOption("any");
  await list.filters.getByLabel("An ending that is").selectOption("punishable");
  await expect(list.strings).toHaveCount(withPunishable.length);
  expect(await shownStrings()).toEqual(withPunishable);

  // The first hit's startup, 10 to 12, and the fastest first.
  await list.filters.getByLabel("An ending that is").selectOption("any");
  await list.filters.getByLabel("Startup from").fill("10");
  await list.filters.getByLabel("Startup to").fill("12");
  await list.filters.getByLabel("Order").selectOption("startup asc");
  await expect(page).toHaveURL(/startupFrom=10&startupTo=12&sort=startup/);
  const startups = async () =>
    (await list.strings.locator('[data-field="startup"]').allTextContents()).map((t) => Number(t));
  const firstOrder = await startups();
  expect(firstOrder.length).toBeGreaterThan(1);
  expect(firstOrder.every((s) => s >= 10 && s <= 12)).toBe(true);
  for (const section of await page.locator("section:has(tr[data-string-key])").all()) {
    const inSection = (await section.locator('tr[data-string-key] [data-field="startup"]').allTextContents()).map(
      Number,
    );
    expect(inSection).toEqual([...inSection].sort((a, b) => a - b));
  }

  // A reload opens the same list.
  await page.reload();
  await expect(list.filters.getByLabel("Startup from")).toHaveValue("10");
  await expect(list.filters.getByLabel("Order")).toHaveValue("startup asc");
  expect(await startups()).toEqual(firstOrder);

  // One stance only: its section alone.
  await list.filters.getByLabel("Done from").selectOption({ label: "Drift" });
  await expect(page.locator("section:has(tr[data-string-key]) h2")).toHaveText(["From Drift (drift)"]);

  // Nothing matches: say so, and put the filters back.
  await page.goto("/games/vesper-circuit/tarrow?level=throw&ending=plus");
  await expect(page.getByRole("status")).toContainText("No string matches these filters.");
  await expectNoSeriousAxe(page, "empty list");
  await page.getByRole("status").getByRole("button", { name: "Clear filters" }).click();
  await expect(list.strings).toHaveCount(all);
  await expect(page).not.toHaveURL(/level=|ending=/);
});

test("on a 390 px phone every row shows its input, its levels and its ending on block without scrolling sideways", async ({
  page,
}, testInfo) => {
  test.skip(testInfo.project.name !== "phone", "a phone's screen");
  await page.setViewportSize({ width: 390, height: 844 });
  const list = new MoveListPage(page);
  await page.goto("/games/vesper-circuit/tarrow");
  await list.openAll();
  const width = await page.evaluate(() => document.scrollingElement?.scrollWidth ?? 0);
  expect(width).toBeLessThanOrEqual(390);

  // Each part's box, left and right, must lie inside the viewport.
  const outside = await page.evaluate(() => {
    const parts = [
      ...document.querySelectorAll<HTMLElement>(
        'tr[data-string-key] th a, tr[data-string-key] [data-level], tr[data-string-key] [data-field="endings"] li, tr[data-move-key] th > span:first-child, tr[data-move-key] [data-level], tr[data-move-key] [data-field="onBlock"], tr[data-cancel-key] [data-field="onBlock"]',
      ),
    ];
    return parts
      .filter((p) => {
        const r = p.getBoundingClientRect();
        return r.left < 0 || r.right > window.innerWidth || r.width === 0;
      })
      .map(
        (p) =>
          `${p.closest("tr")?.getAttribute("data-string-key") ?? p.closest("tr")?.getAttribute("data-move-key")}: ${p.textContent}`,
      );
  });
  expect(outside).toEqual([]);
  await expectNoSeriousAxe(page, "phone, every string open");
});

test("the open list has no serious accessibility problem", async ({ page }, testInfo) => {
  const list = new MoveListPage(page);
  await page.goto("/games/vesper-circuit/quessaline");
  await list.openAll();
  await expectNoSeriousAxe(page, "every string open");
  // Each figure is in a real table cell under its header; a phone keeps startup and damage under the input.
  const headers = [/String/, /Hits/, /On block/, /Startup/, /Damage/];
  await expect(page.getByRole("table").first().getByRole("columnheader")).toHaveText(
    testInfo.project.name === "phone" ? headers.slice(0, 3) : headers,
  );
});

test("an unknown character shows the not-found page with status 404", async ({ page }) => {
  const response = await page.goto("/games/vesper-circuit/nobody");
  expect(response?.status()).toBe(404);
  await expect(page.getByRole("heading", { name: "Not here" })).toBeVisible();
});

test("the health route reports the database", async ({ request }) => {
  const response = await request.get("/api/health");
  expect(response.status()).toBe(200);
  expect(await response.json()).toMatchObject({ status: "ok", database: { ok: true } });
});
