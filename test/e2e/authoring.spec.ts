import { randomUUID } from "node:crypto";
import { expect, test } from "@playwright/test";
import { query } from "./db";
import { joinAsPlayer, signUpAs, TeamsPage } from "./pages/team-pages";

// A coach brings a game of the team's own in: starts it from the team page, adds a character,
// publishes the first Edition and starts the next one as a draft; a player of the team reads
// the game and finds no edit control.

test.describe.configure({ timeout: 120_000 });

test.beforeEach(async () => {
  // Sign-up is rate limited per address, and every test comes from 127.0.0.1.
  await query("delete from rate_limits");
});

const tag = () => randomUUID().slice(0, 6);

test("a coach starts a game, adds a character, publishes the first Edition and starts the next; a player only reads", async ({
  page,
  browser,
}) => {
  const coachEmail = `coach-${tag()}@example.test`;
  const teamName = `Lantern Yard ${tag()}`;
  await signUpAs(page, "Coach Ysomarr-11", coachEmail, "/teams");
  await new TeamsPage(page).create(teamName);

  // Mistakes show at their field, in words, and nothing is made.
  const form = page.getByRole("form", { name: "Start a game" });
  await form.getByLabel("Frames per second").fill("0");
  // Range in numbers asks for its unit.
  await form.getByLabel("Range is measured as").selectOption("number");
  // Enter in a field sends the form, as the keyboard does.
  await form.getByLabel("Frames per second").press("Enter");
  await expect(form.getByText("Give the game a name.")).toBeVisible();
  await expect(form.getByText("Frames per second must be at least 1.")).toBeVisible();
  await expect(form.getByText(/Name the unit the game measures range in/)).toBeVisible();
  await form.getByLabel("Unit of range").fill("m");

  const gameName = `Tidewire ${tag()}`;
  await form.getByLabel("Game name").fill(gameName);
  await form.getByLabel("Frames per second").fill("60");
  await form.getByLabel("First Edition").fill("0.9");
  await form.getByLabel("First Edition").press("Enter");
  await expect(page.getByRole("heading", { level: 1, name: gameName })).toBeVisible();
  await expect(page.getByText("0.9", { exact: true })).toBeVisible();
  await expect(page.getByText("draft", { exact: true })).toBeVisible();
  await expect(page.getByText(/range in m/)).toBeVisible();

  const character = page.getByRole("form", { name: "Add a character" });
  await character.getByLabel("Name").fill("Player Ashcorin-6");
  await character.getByRole("button", { name: "Add character" }).click();
  await expect(page.getByRole("link", { name: "Player Ashcorin-6", exact: true })).toBeVisible();

  // Publishing asks first, then freezes the draft.
  await page.getByRole("button", { name: "Publish…" }).click();
  await page.getByRole("button", { name: "Yes, publish 0.9" }).click();
  await expect(page.getByRole("form", { name: "Start the next Edition" })).toBeVisible();
  await expect(page.getByText("draft", { exact: true })).toHaveCount(0);

  const next = page.getByRole("form", { name: "Start the next Edition" });
  await next.getByLabel("Name").fill("1.0");
  await next.getByRole("button", { name: "Start the draft" }).click();
  await expect(page.getByRole("heading", { name: "Publish 1.0" })).toBeVisible();
  const gameUrl = page.url();

  const rows = await query<{ status: string; name: string }>(
    "select e.status, e.name from editions e join games g on g.id = e.game_id where g.name = ? order by e.id",
    [gameName],
  );
  expect(rows).toEqual([
    { status: "published", name: "0.9" },
    { status: "draft", name: "1.0" },
  ]);

  // A player of the team reads the game, drafts included, and is offered no change.
  const player = await joinAsPlayer(browser, teamName, "Coach Okorbit");
  await player.goto(gameUrl);
  await expect(player.getByRole("heading", { level: 1, name: gameName })).toBeVisible();
  await expect(player.getByRole("link", { name: "Player Ashcorin-6", exact: true })).toBeVisible();
  await expect(player.getByRole("heading", { name: "Edit this game" })).toHaveCount(0);
  await expect(player.getByRole("button", { name: /Publish/ })).toHaveCount(0);
  await player.goto("/teams");
  await player.getByRole("link", { name: teamName }).click();
  await expect(player.getByRole("form", { name: "Start a game" })).toHaveCount(0);
  await player.close();
});
