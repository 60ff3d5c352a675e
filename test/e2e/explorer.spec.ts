import { expect, test } from "@playwright/test";
import { query } from "./db";
import { ExplorerPage } from "./pages/explorer-page";

async function onBlock(key: string, edition = "1-1"): Promise<number> {
  const [row] = await query<{ on_block: string }>(
    `select m.on_block from moves m join characters c on c.id = m.character_id join editions e on e.id = m.edition_id
     where c.slug = 'tarrow' and e.slug = ? and m.\`key\` = ?`,
    [edition, key],
  );
  return Number(row?.on_block);
}

async function cancelOnBlock(key: string, edition = "1-1"): Promise<number> {
  const [row] = await query<{ on_block: string }>(
    `select x.on_block from edges x join characters c on c.id = x.character_id join editions e on e.id = x.edition_id
     where c.slug = 'tarrow' and e.slug = ? and x.\`key\` = ?`,
    [edition, key],
  );
  return Number(row?.on_block);
}

const signed = (n: number) => (n > 0 ? `+${n}` : String(n));

test("a player opens a string from the move list, picks a node and reads its path", async ({ page }) => {
  await page.goto("/games/vesper-circuit/tarrow");
  await page.getByRole("link", { name: "2", exact: true }).click();
  await expect(page).toHaveURL(/\/explore\/2\?/);

  const explorer = new ExplorerPage(page);
  await expect(explorer.emptyCard).toBeVisible();
  await explorer.node("2,2,3").click();

  const raw = await onBlock("2,2,3");
  await expect(explorer.field("input")).toContainText("2,2,3");
  await expect(explorer.field("onBlock")).toHaveText(signed(raw));
  await expect(explorer.field("blockClass")).toHaveText("punishable"); // -14 with a 10-frame fastest attack
  await expect(explorer.field("naturalCombo")).toContainText("yes");

  // The cancel into Ember Guard: its own outcome, and the frames it saves over stopping at 2,2,3.
  await explorer.node("stance:ember").click();
  const cancelled = await cancelOnBlock("2,2,3~f>ember");
  await expect(explorer.field("input")).toContainText("2,2,3~f");
  await expect(explorer.field("onBlock")).toHaveText(signed(cancelled));
  await expect(explorer.field("framesSaved")).toContainText(`${cancelled - raw}f`);
  await expect(explorer.field("blockClass")).toHaveText("safe");
  await expect(explorer.field("autoGuard")).toContainText("high, mid");
});

test("the selected path and the options survive a reload, and an option recomputes at once", async ({ page }) => {
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/2");
  await explorer.node("2,2,3").click();
  await expect(explorer.field("blockClass")).toHaveText("punishable");

  // With the opponent's fastest attack at 15 frames, -14 is no longer punishable.
  await explorer.setOption("Opponent's fastest", 15);
  await expect(explorer.field("blockClass")).toHaveText("safe");
  await expect(page).toHaveURL(/fastest=15/);

  await page.reload();
  await expect(explorer.field("input")).toContainText("2,2,3");
  await expect(explorer.field("blockClass")).toHaveText("safe");
});

test("an Edition switch shows that Edition's numbers for the same path", async ({ page }) => {
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/2");
  await explorer.node("stance:ember").click();
  await expect(explorer.field("onBlock")).toHaveText(signed(await cancelOnBlock("2,2,3~f>ember", "1-1")));

  await page.getByRole("combobox", { name: "Edition" }).selectOption("1-0");
  await expect(page).toHaveURL(/edition=1-0/);
  await expect(explorer.field("onBlock")).toHaveText(signed(await cancelOnBlock("2,2,3~f>ember", "1-0")));
});

test("an unknown move is a 404", async ({ page }) => {
  const response = await page.goto("/games/vesper-circuit/tarrow/explore/9%2C9%2C9");
  expect(response?.status()).toBe(404);
});

test("a blocked low leaves the defender crouching, and the card lists the punishers that come out of a crouch", async ({ page }) => {
  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/1");
  await explorer.node("1,2,4").click(); // ends in a low at -13
  await expect(explorer.field("defenderStance")).toHaveText("crouching");

  const panel = page.getByTestId("punish-panel");
  await expect(panel.getByTestId("punish-verdict")).toContainText("crouching");
  const startups = await query<{ input: string; startup: number; from_posture: string }>(
    `select m.input, m.startup, m.from_posture from moves m join characters c on c.id = m.character_id
       join editions e on e.id = m.edition_id
     where c.slug = 'tarrow' and e.slug = '1-1' and m.startup is not null and m.stance_id is null`,
  );
  const listed = await panel.locator("[data-testid=punishers] [data-option]").evaluateAll((els) => els.map((e) => e.getAttribute("data-option")));
  const expected = startups.filter((m) => m.startup <= 13 && m.from_posture !== "standing").map((m) => m.input);
  expect(listed.sort()).toEqual(expected.sort());
  expect(listed.length).toBeGreaterThan(0);

  // Against another opponent the list is theirs.
  await panel.getByRole("combobox", { name: "Opponent" }).selectOption({ label: "Velka" });
  await expect(page).toHaveURL(/vs=\d+/);
  await expect(panel.getByTestId("punish-verdict")).toContainText("Velka");
});
