import { expect, test } from "@playwright/test";
import { query } from "./db";
import { MoveListPage } from "./pages/move-list-page";

const signed = (n: number) => (n > 0 ? `+${n}` : String(n));

interface MoveRow {
  key: string;
  on_block: string;
}

async function movesOf(character: string, edition: string) {
  return query<MoveRow>(
    `select m.\`key\`, m.on_block from moves m
       join characters c on c.id = m.character_id
       join editions e on e.id = m.edition_id
     where c.slug = ? and e.slug = ? order by m.sort`,
    [character, edition],
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

  // Every move of the newest edition is a row, in the database's order.
  const expected = await movesOf("tarrow", "1-1");
  expect(expected.length).toBeGreaterThanOrEqual(25);
  await expect(list.rows).toHaveCount(expected.length);
  const shownKeys = await list.rows.evaluateAll((rows) => rows.map((r) => r.getAttribute("data-move-key")));
  expect([...shownKeys].sort()).toEqual(expected.map((m) => m.key).sort());

  // And the numbers are the database's numbers.
  for (const m of expected.slice(0, 8)) {
    const value = JSON.parse(m.on_block) as number | { state: string };
    const text = typeof value === "number" ? signed(value) : value.state;
    await expect(list.field(m.key, "onBlock")).toHaveText(text);
  }
  expect(errors).toEqual([]);
});

test("switching the edition shows that edition's frame data", async ({ page }) => {
  const list = new MoveListPage(page);
  await page.goto("/games/vesper-circuit/tarrow");
  const [newer] = (await movesOf("tarrow", "1-1")).filter((m) => m.key === "d+4");
  const [older] = (await movesOf("tarrow", "1-0")).filter((m) => m.key === "d+4");
  expect(newer?.on_block).not.toEqual(older?.on_block);

  await expect(list.field("d+4", "onBlock")).toHaveText(signed(Number(newer?.on_block)));
  await list.chooseEdition("1.0 Launch");
  await expect(page).toHaveURL(/edition=1-0/);
  await expect(list.field("d+4", "onBlock")).toHaveText(signed(Number(older?.on_block)));
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
