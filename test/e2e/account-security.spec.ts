import { randomUUID } from "node:crypto";
import { expect, test, type Browser, type Page } from "@playwright/test";
import { query } from "./db";
import { linkIn, waitForMailAbout } from "./mail";
import {
  AccountArea,
  CONFIRM_SUBJECT,
  formAlert,
  MISMATCH,
  newEmail,
  PasswordResetPages,
  SignInPage,
  signUpAndConfirm,
  SignUpPage,
} from "./pages/auth-pages";
import { TeamPage, TeamsPage } from "./pages/team-pages";

// The account-security issue in the browser: no one gets in through an address they never
// proved, and every way of ending sessions ends them at once, in every browser. Each test uses
// separate browser contexts for separate browsers (or people).

const PASSWORD = "counter-hit-whiff-drills";
const UNCONFIRMED = "Confirm your e-mail address first: open the link we e-mailed you when you created the account.";

// Each test is a whole story across several browsers, each signing up through the mail.
test.describe.configure({ timeout: 90_000 });

// The limits count per address too, and every test comes from 127.0.0.1.
test.beforeEach(async () => {
  await query("delete from rate_limits");
});

async function newPage(browser: Browser): Promise<Page> {
  return (await browser.newContext()).newPage();
}

async function signIn(page: Page, email: string, password: string, name: string) {
  const form = new SignInPage(page);
  await form.goto();
  await form.signIn(email, password);
  await expect(new AccountArea(page).user(name)).toBeVisible();
}

/** The next page this browser opens finds it signed out. */
async function expectSignedOut(page: Page) {
  await page.goto("/account");
  await expect(page).toHaveURL(/\/sign-in\?callbackUrl=%2Faccount$/);
  await expect(new AccountArea(page).signInLink).toBeVisible();
}

async function expectSignedIn(page: Page, name: string) {
  await page.goto("/account");
  await expect(page.getByRole("heading", { name: "Your account" })).toBeVisible();
  await expect(new AccountArea(page).user(name)).toBeVisible();
}

test("the takeover story: an unproven sign-up cannot be used, and the owner's link sign-in voids its password", async ({
  page: squatter,
  browser,
}) => {
  const coach = newEmail("coach");

  // Someone signs up with the coach's address before the coach ever comes.
  const signUp = new SignUpPage(squatter);
  await signUp.goto();
  await signUp.signUp({ name: "Not The Coach", email: coach, password: PASSWORD });
  await expect(squatter.getByRole("heading", { name: "Check your e-mail" })).toBeVisible();
  await expectSignedOut(squatter);

  // The right password is not enough while the address is unproven.
  const form = new SignInPage(squatter);
  await form.goto();
  await form.signIn(coach, PASSWORD);
  await expect(form.alert.first()).toHaveText(UNCONFIRMED);
  await squatter.getByRole("button", { name: "E-mail me a new confirmation link" }).click();
  await expect(squatter.getByRole("main").getByRole("status")).toContainText(
    "If that address has an account waiting to be confirmed, we sent it a new link.",
  );
  await expect(new AccountArea(squatter).signInLink).toBeVisible();
  const unopened = linkIn(await waitForMailAbout(coach, CONFIRM_SUBJECT));

  // The coach signs in with an e-mailed link, as they always could.
  const owner = await newPage(browser);
  const ownerForm = new SignInPage(owner);
  await ownerForm.goto();
  await ownerForm.askForLink(coach);
  await expect(owner.getByRole("heading", { name: "Check your e-mail" })).toBeVisible();
  await owner.goto(linkIn(await waitForMailAbout(coach, "Your Framefork sign-in link")));
  await expect(new AccountArea(owner).signOut).toBeVisible();

  // The password someone else chose is gone, and so is any session of theirs.
  const [row] = await query<{ password_hash: string | null; email_verified: Date | null }>(
    "select password_hash, email_verified from users where email = ?",
    [coach],
  );
  expect(row?.password_hash).toBeNull();
  expect(row?.email_verified).not.toBeNull();
  await expectSignedOut(squatter);
  await form.goto();
  await form.signIn(coach, PASSWORD);
  await expect(form.alert.first()).toHaveText(MISMATCH);
  // The confirmation links that went to the coach's inbox no longer do anything.
  await squatter.goto(unopened);
  await expect(squatter.getByRole("heading", { name: "Already confirmed" })).toBeVisible();
  await expect(squatter.getByRole("button", { name: "Confirm my address" })).toHaveCount(0);
  await expectSignedOut(squatter);
  // The coach is still in.
  await owner.reload();
  await expect(new AccountArea(owner).signOut).toBeVisible();
});

test("a password change ends the other session at once; the browser that changed it stays signed in", async ({
  page: first,
  browser,
}) => {
  const email = newEmail("change");
  await signUpAndConfirm(first, { name: "Player Farrowdeep-2", email, password: PASSWORD });
  const second = await newPage(browser);
  await signIn(second, email, PASSWORD, "Player Farrowdeep-2");

  await first.goto("/account");
  const form = first.getByRole("form", { name: "Change your password" });
  await form.getByLabel("Current password").fill(PASSWORD);
  await form.getByLabel("New password").fill("a-new-and-longer-password");
  await form.getByRole("button", { name: "Change password" }).click();
  await expect(first.getByRole("main").getByRole("status")).toContainText("Your password is changed.");

  await expectSignedOut(second);
  await expectSignedIn(first, "Player Farrowdeep-2");
  await signIn(second, email, "a-new-and-longer-password", "Player Farrowdeep-2");
});

test("a password reset ends every session at once", async ({ page: first, browser }) => {
  const email = newEmail("reset");
  await signUpAndConfirm(first, { name: "Player Dahlwisp", email, password: PASSWORD });
  const second = await newPage(browser);
  await signIn(second, email, PASSWORD, "Player Dahlwisp");

  const elsewhere = await newPage(browser);
  const reset = new PasswordResetPages(elsewhere);
  await reset.askForReset(email);
  await elsewhere.goto(linkIn(await waitForMailAbout(email, "Reset your Framefork password")));
  await reset.chooseNewPassword("a-password-after-the-reset");
  await expect(elsewhere.getByRole("main").getByRole("status")).toHaveText(
    "Your password is changed. Sign in with the new one.",
  );

  await expectSignedOut(first);
  await expectSignedOut(second);
});

test("sign out everywhere ends this session and the other one", async ({ page: first, browser }) => {
  const email = newEmail("everywhere");
  await signUpAndConfirm(first, { name: "Player Lundpixel", email, password: PASSWORD });
  const second = await newPage(browser);
  await signIn(second, email, PASSWORD, "Player Lundpixel");

  await first.goto("/account");
  await first.getByRole("button", { name: "Sign out everywhere" }).click();
  await expect(first).toHaveURL(/\/sign-in\?signedOut=everywhere$/);
  await expect(first.getByRole("main").getByRole("status")).toHaveText(
    "You are signed out on every device, this one too.",
  );
  await expect(new AccountArea(first).signInLink).toBeVisible();

  await expectSignedOut(second);
  await expectSignedOut(first);
  // Signing in again works as before.
  await signIn(second, email, PASSWORD, "Player Lundpixel");
});

test("a member removed from a team loses it in their open session at once", async ({ page: owner, browser }) => {
  await signUpAndConfirm(owner, { name: "Player Runavox", email: newEmail("owner"), password: PASSWORD }, "/teams");
  const teamName = `Night Shift ${randomUUID().slice(0, 4)}`;
  await new TeamsPage(owner).create(teamName);
  const slug = new URL(owner.url()).pathname.split("/").at(-1)!;

  const memberEmail = newEmail("member");
  const member = await newPage(browser);
  await signUpAndConfirm(member, { name: "Player Solvaneth", email: memberEmail, password: PASSWORD });
  // Membership straight from the database: this test is about removal, not invites.
  await query(
    "insert into memberships (team_id, user_id, role) select t.id, u.id, 'player' from teams t, users u where t.slug = ? and u.email = ?",
    [slug, memberEmail],
  );
  await member.goto(`/teams/${slug}`);
  await expect(member.getByRole("heading", { level: 1, name: teamName })).toBeVisible();

  await owner.reload();
  const team = new TeamPage(owner);
  await team.member(memberEmail).getByRole("button", { name: "Remove" }).click();
  await expect(team.member(memberEmail)).toHaveCount(0);

  // Still signed in, but the team is gone from every page of theirs.
  const again = await member.goto(`/teams/${slug}`);
  expect(again?.status()).toBe(404);
  await expect(member.getByRole("heading", { level: 1, name: teamName })).toHaveCount(0);
  await member.goto("/teams");
  await expect(member.getByText(teamName)).toHaveCount(0);
  await expect(new AccountArea(member).user("Player Solvaneth")).toBeVisible();
});

test("a confirmation link opened after it expired says what to do", async ({ page }) => {
  const email = newEmail("late");
  const signUp = new SignUpPage(page);
  await signUp.goto();
  await signUp.signUp({ name: "Player Brisklet", email, password: PASSWORD });
  const link = linkIn(await waitForMailAbout(email, CONFIRM_SUBJECT));
  await query(
    "update email_confirmations c join users u on u.id = c.user_id set c.expires_at = utc_timestamp() - interval 1 minute where u.email = ?",
    [email],
  );
  await page.goto(link);
  await expect(formAlert(page)).toContainText("This link has expired");
  await page.getByRole("main").getByRole("link", { name: "Sign in" }).click();
  await expect(page).toHaveURL(/\/sign-in$/);
});
