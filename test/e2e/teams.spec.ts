import { randomUUID } from "node:crypto";
import { expect, test, type Browser } from "@playwright/test";
import { query } from "./db";
import { linkIn, waitForMail } from "./mail";
import { confirmAddress } from "./pages/auth-pages";
import { ExplorerPage } from "./pages/explorer-page";
import { signUpAs, TeamPage, TeamsPage } from "./pages/team-pages";

const newEmail = (tag: string) => `${tag}-${randomUUID().slice(0, 8)}@example.test`;

// Signing up goes through the mail (the address is confirmed before the account works).
test.describe.configure({ timeout: 90_000 });

// Sign-up is rate limited per address, and every test comes from 127.0.0.1.
test.beforeEach(async () => {
  await query("delete from rate_limits");
});

async function freshPage(browser: Browser) {
  const context = await browser.newContext();
  return context.newPage();
}

test("an owner invites a player by e-mail; the player accepts from the mail and sees the team", async ({
  page,
  browser,
}) => {
  const ownerEmail = newEmail("owner");
  const playerEmail = newEmail("player");
  const teamName = `Harbor Lights ${randomUUID().slice(0, 4)}`;

  await signUpAs(page, "Player Quellborn-7", ownerEmail, "/teams");
  await expect(page.getByTestId("no-teams")).toBeVisible();
  const team = await new TeamsPage(page).create(teamName);
  await expect(team.member(ownerEmail)).toContainText("owner");
  await team.inviteSomeone(playerEmail, "player");

  // The invite is a real e-mail with both parts, and its link works for the invited address.
  const mail = await waitForMail(playerEmail);
  expect(mail.subject).toContain(teamName);
  expect(mail.html).toContain(teamName);
  const link = linkIn(mail);
  expect(link).toMatch(/\/invites\/[A-Za-z0-9_-]{43}$/);

  const player = await freshPage(browser);
  await player.goto(link);
  await expect(player.getByRole("heading", { name: `Join ${teamName}` })).toBeVisible();
  await player.getByRole("link", { name: "Create an account to accept" }).click();
  // The address the invite went to is filled in.
  await expect(player.getByRole("form", { name: "Create your account" }).getByLabel("E-mail")).toHaveValue(playerEmail);
  await player.getByRole("form", { name: "Create your account" }).getByLabel("Name").fill("Player Okadrune");
  await player.getByRole("form", { name: "Create your account" }).getByLabel("Password").fill("frame-trap-drills");
  await player.getByRole("button", { name: "Create account" }).click();
  // The address is proven through the mail; its link leads back to the invite, signed in.
  await confirmAddress(player, playerEmail);
  await expect(player.getByRole("button", { name: "Accept and join" })).toBeVisible();
  await player.getByRole("button", { name: "Accept and join" }).click();

  await expect(player.getByRole("heading", { level: 1, name: teamName })).toBeVisible();
  const asPlayer = new TeamPage(player);
  await expect(asPlayer.member(playerEmail)).toContainText("player");
  // A player neither invites nor reads the log.
  await expect(asPlayer.invite).toHaveCount(0);
  await expect(asPlayer.log).toHaveCount(0);

  // The link works once.
  await player.goto(link);
  await expect(player.getByTestId("invite").getByRole("alert")).toContainText("already been used");

  await page.reload();
  await expect(team.member(playerEmail)).toContainText("player");
  await expect(team.log).toContainText(`invited ${playerEmail} as player`);
  await expect(team.log).toContainText("Player Okadrune");
});

test("a player shares a permalink; a stranger opens the public one, is refused the team-only one; a revoked link is a 404", async ({
  page,
  browser,
}) => {
  const playerEmail = newEmail("sharer");
  await signUpAs(page, "Player Strattlebee", playerEmail);
  // The team and the player's place in it come straight from the database: this test is about sharing.
  const [player] = await query<{ id: string }>("select id from users where email = ?", [playerEmail]);
  const slug = `share-crew-${randomUUID().slice(0, 6)}`;
  await query("insert into teams (slug, name) values (?, ?)", [slug, "Share Crew"]);
  const [team] = await query<{ id: number }>("select id from teams where slug = ?", [slug]);
  await query("insert into memberships (team_id, user_id, role) values (?, ?, 'player')", [team!.id, player!.id]);

  const explorer = new ExplorerPage(page);
  await page.goto("/games/vesper-circuit/tarrow/explore/v");
  await explorer.select("v.v");
  await expect(explorer.field("input")).toContainText("v.v");

  const share = async (who: "Anyone with the link" | "Team only") => {
    await page.getByRole("button", { name: "Share" }).click();
    const dialog = page.getByRole("dialog", { name: "Share this view" });
    await dialog.getByRole("radio", { name: new RegExp(who) }).check();
    await dialog.getByRole("button", { name: "Make the link" }).click();
    const url = await dialog.getByTestId("permalink-url").inputValue();
    // Escape closes it, as a modal dialog should.
    await page.keyboard.press("Escape");
    await expect(dialog).toBeHidden();
    return url;
  };
  const open = await share("Anyone with the link");
  await page.reload();
  const teamOnly = await share("Team only");
  expect(open).toMatch(/\/s\/[A-Za-z0-9_-]{24}$/);
  expect(teamOnly).not.toBe(open);

  // A stranger, signed out: the public link shows the same path, pinned, read-only.
  const stranger = await freshPage(browser);
  const shown = await stranger.goto(open);
  expect(shown?.status()).toBe(200);
  const strangerView = new ExplorerPage(stranger);
  await expect(strangerView.pathMark("v.v")).toHaveCount(1);
  await expect(strangerView.field("input")).toContainText("v.v");
  await expect(stranger.getByText(/Pinned to edition/)).toBeVisible();
  // Link previews get a PNG of it.
  const image = await stranger.locator('meta[property="og:image"]').getAttribute("content");
  const png = await stranger.request.get(image!);
  expect(png.headers()["content-type"]).toBe("image/png");
  expect((await png.body()).subarray(1, 4).toString()).toBe("PNG");

  // The team-only link is "not available" to a signed-out stranger, as an unknown link is, with a
  // way to sign in and come back; a signed-in stranger is refused the same way.
  const signedOut = await stranger.goto(teamOnly);
  expect(signedOut?.status()).toBe(404);
  await expect(stranger.getByRole("heading", { name: "This link is not available" })).toBeVisible();
  await expect(stranger.getByRole("main").getByRole("link", { name: "sign in", exact: true })).toHaveAttribute(
    "href",
    `/sign-in?callbackUrl=${encodeURIComponent(new URL(teamOnly).pathname)}`,
  );
  await signUpAs(stranger, "Player Vantorel", newEmail("stranger"));
  const refused = await stranger.goto(teamOnly);
  expect(refused?.status()).toBe(404);
  await expect(stranger.getByRole("heading", { name: "This link is not available" })).toBeVisible();

  // The player revokes the public link from the team page; it is gone for everyone.
  await page.goto(`/teams/${slug}`);
  const links = new TeamPage(page).links;
  await expect(links.locator("li")).toHaveCount(2);
  const publicRow = links.locator(`li[data-permalink="${open.split("/s/")[1]}"]`);
  await publicRow.getByRole("button", { name: "Revoke" }).click();
  await expect(publicRow).toContainText("revoked");
  const gone = await stranger.goto(open);
  expect(gone?.status()).toBe(404);
  await expect(stranger.getByRole("heading", { name: "This link is not available" })).toBeVisible();
  const unknown = await stranger.goto("/s/AAAAAAAAAAAAAAAAAAAAAAAA");
  expect(unknown?.status()).toBe(404);
});

test("a team name that looks like a script or SQL is shown as the text it is", async ({ page }) => {
  await signUpAs(page, "Coach Vellumora", newEmail("text"), "/teams");
  const name = `<img src=x onerror="window.ffInjected=1"> Crew'); DROP TABLE teams;--`;
  await new TeamsPage(page).create(name);
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(name);
  expect(await page.evaluate(() => (window as unknown as { ffInjected?: number }).ffInjected)).toBeUndefined();
  await page.goto("/teams");
  await expect(page.getByTestId("team-list")).toContainText(name);
});

test("the sign-up, team, invite and shared pages have no serious or critical accessibility violations", async ({
  page,
  browser,
}) => {
  const { default: AxeBuilder } = await import("@axe-core/playwright");
  const check = async (p: typeof page, where: string) => {
    const results = await new AxeBuilder({ page: p }).analyze();
    const bad = results.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
    expect(bad.map((v) => `${where} ${v.id}: ${v.nodes.length} node(s), e.g. ${v.nodes[0]?.target.join(" ")}`)).toEqual(
      [],
    );
  };
  await page.goto("/sign-up");
  await check(page, "sign-up");
  await signUpAs(page, "Axe Runner", newEmail("axe"), "/teams");
  await check(page, "teams");
  const team = await new TeamsPage(page).create("Audit Crew");
  const invitedEmail = newEmail("invited");
  await team.inviteSomeone(invitedEmail, "viewer");
  await check(page, "team");

  const other = await freshPage(browser);
  await other.goto(linkIn(await waitForMail(invitedEmail)));
  await check(other, "invite");
});

test("past the hourly limit on invites, the invite form says so and how long to wait", async ({ page }) => {
  await signUpAs(page, "Player Strattlebee", newEmail("limit"), "/teams");
  const team = await new TeamsPage(page).create(`Busy Roster ${randomUUID().slice(0, 4)}`);
  const { origin, pathname } = new URL(page.url());
  // A whole roster sent at once (through the API, as the form does), up to the limit for one sender.
  for (let i = 0; i < 20; i++) {
    const res = await page.request.post(`${pathname.replace(/^\/teams\//, "/api/teams/")}/invites`, {
      data: { email: newEmail("roster"), role: "viewer" },
      headers: { origin },
    });
    expect(res.status()).toBe(201);
  }
  const next = newEmail("one-more");
  await team.invite.getByLabel("E-mail").fill(next);
  await team.invite.getByRole("button", { name: "Send invite" }).click();
  await expect(team.invite.getByRole("alert")).toContainText(
    /reached the limit on invites for the last hour\. .*try again in \d+ minutes?\./,
  );
  // Nothing typed is lost: the address is still there to send later.
  await expect(team.invite.getByLabel("E-mail")).toHaveValue(next);
});
