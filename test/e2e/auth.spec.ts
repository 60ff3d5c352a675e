import { expect, test, type Page } from "@playwright/test";
import { query } from "./db";
import { linkIn, mailCount, waitForMail, waitForMailAbout } from "./mail";
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

const PASSWORD = "stance-cancel-practice";

// Signing up goes through the mail (the address is confirmed before the account works).
test.describe.configure({ timeout: 60_000 });

// The limits count per address too, and every test comes from 127.0.0.1.
test.beforeEach(async () => {
  await query("delete from rate_limits");
});

async function signUp(page: Page, name: string, email: string, password = PASSWORD, callbackUrl?: string) {
  await signUpAndConfirm(page, { name, email, password }, callbackUrl);
}

async function signOut(page: Page) {
  const area = new AccountArea(page);
  await area.signOut.click();
  await expect(area.signInLink).toBeVisible();
}

test("a new player signs up, signs out and signs in again", async ({ page }) => {
  const email = newEmail("player");
  await signUp(page, "Player Corvalis", email);

  // The account is in MariaDB with an argon2id hash, never the password itself.
  const [row] = await query<{ password_hash: string; name: string }>(
    "select password_hash, name from users where email = ?",
    [email],
  );
  expect(row?.name).toBe("Player Corvalis");
  expect(row?.password_hash).toMatch(/^\$argon2id\$/);

  await signOut(page);
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(email.toUpperCase(), PASSWORD);
  await expect(new AccountArea(page).user("Player Corvalis")).toBeVisible();
});

test("sign-in takes a callbackUrl on this site and ignores one elsewhere", async ({ page }) => {
  const email = newEmail("back");
  await signUp(page, "Coach Ferrowyn", email, PASSWORD, "/games");
  await expect(page).toHaveURL(/\/games$/);
  await signOut(page);

  const signIn = new SignInPage(page);
  await signIn.goto("https://elsewhere.example.test/phish");
  await signIn.signIn(email, PASSWORD);
  await expect(new AccountArea(page).user("Coach Ferrowyn")).toBeVisible();
  await expect(page).toHaveURL(/127\.0\.0\.1:\d+\/$/);
});

test("a wrong password and an unknown e-mail get the same message", async ({ page }) => {
  const email = newEmail("wrong");
  await signUp(page, "Player Iverlune", email);
  await signOut(page);

  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(email, "not-the-password");
  await expect(signIn.alert).toHaveText(MISMATCH);
  await signIn.signIn(newEmail("nobody"), PASSWORD);
  await expect(signIn.alert).toHaveText(MISMATCH);
  await expect(new AccountArea(page).signInLink).toBeVisible();
});

test("sign-up refuses a short password beside the field, and answers a taken e-mail like a new one", async ({
  page,
}) => {
  const email = newEmail("taken");
  const signUpPage = new SignUpPage(page);
  await signUpPage.goto();
  await signUpPage.signUp({ name: "Player Marshglint", email, password: "short" });
  await expect(signUpPage.form.getByText("Use at least 10 characters for your password.")).toBeVisible();

  await signUp(page, "Player Marshglint", email);
  await signOut(page);
  // Someone else tries the same address: the same page as for a new address, and the account's
  // owner (not the visitor) learns it already exists.
  const fresh = newEmail("fresh");
  const answers: string[] = [];
  for (const address of [email, fresh]) {
    await signUpPage.goto();
    await signUpPage.signUp({ name: "Someone Else", email: address, password: PASSWORD });
    await expect(page.getByRole("heading", { name: "Check your e-mail" })).toBeVisible();
    answers.push(`${page.url()}\n${await page.getByRole("main").innerText()}`);
  }
  expect(answers[0]).toBe(answers[1]);
  const note = await waitForMailAbout(email, "You already have a Framefork account");
  expect(note.text).toContain("/sign-in");
  await waitForMailAbout(fresh, CONFIRM_SUBJECT);
  // The existing account still opens with its own password, not the newcomer's.
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(email, PASSWORD);
  await expect(new AccountArea(page).user("Player Marshglint")).toBeVisible();
});

test("a forgotten password is reset through the e-mailed link, once", async ({ page }) => {
  const email = newEmail("reset");
  await signUp(page, "Coach Calderix", email);
  await signOut(page);

  const reset = new PasswordResetPages(page);
  await reset.askForReset(email);
  await expect(page.getByRole("heading", { name: "Check your e-mail" })).toBeVisible();
  const mail = await waitForMailAbout(email, "Reset your Framefork password");
  expect(mail.html).toContain("Choose a new password");
  const link = linkIn(mail);

  // Only the SHA-256 of the token is stored.
  const token = new URL(link).searchParams.get("token")!;
  const rows = await query<{ token_hash: string }>(
    "select r.token_hash from password_resets r join users u on u.id = r.user_id where u.email = ?",
    [email],
  );
  expect(rows.map((r) => r.token_hash)).toEqual([await sha256(token)]);

  await page.goto(link);
  await reset.chooseNewPassword("a-brand-new-password");
  await expect(page.getByRole("status")).toHaveText("Your password is changed. Sign in with the new one.");

  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(email, PASSWORD);
  await expect(signIn.alert).toHaveText(MISMATCH);
  await signIn.signIn(email, "a-brand-new-password");
  await expect(new AccountArea(page).user("Coach Calderix")).toBeVisible();

  // The same link a second time says it was used and offers a new one.
  await page.goto(link);
  await expect(formAlert(page)).toContainText("This reset link was already used.");
  await page.getByRole("link", { name: "Send me a new link" }).click();
  await expect(page).toHaveURL(/\/forgot-password$/);
});

test("a reset request answers the same whether or not the account exists", async ({ page }) => {
  const nobody = newEmail("ghost");
  await new PasswordResetPages(page).askForReset(nobody);
  await expect(page.getByRole("heading", { name: "Check your e-mail" })).toBeVisible();
  await expect(page.getByText("If an account uses that address")).toBeVisible();
  expect(await mailCount(nobody)).toBe(0);
});

test("too many reset requests for one address are refused with the wait; the sign-in link still comes", async ({
  page,
}) => {
  const email = newEmail("flood");
  const reset = new PasswordResetPages(page);
  // LIMITS.passwordResetEmailIp: three from one address in 15 minutes.
  for (let i = 0; i < 3; i++) {
    await reset.askForReset(email);
    await expect(page.getByRole("heading", { name: "Check your e-mail" })).toBeVisible();
  }
  await reset.askForReset(email);
  await expect(formAlert(page)).toHaveText(/^Too many attempts, try again in \d+ minutes?\.$/);

  // Sign-in links have their own budget.
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.askForLink(email);
  await expect(page.getByRole("heading", { name: "Check your e-mail" })).toBeVisible();
  expect((await waitForMail(email)).subject).toBe("Your Framefork sign-in link");
});

test("a player signs in with an e-mailed link, which works only once", async ({ page, context }) => {
  const email = newEmail("link");
  const signIn = new SignInPage(page);
  await signIn.goto("/help");
  await signIn.askForLink(email);
  await expect(page.getByRole("heading", { name: "Check your e-mail" })).toBeVisible();

  const mail = await waitForMail(email);
  expect(mail.subject).toBe("Your Framefork sign-in link");
  const link = linkIn(mail);
  await page.goto(link);
  await expect(page).toHaveURL(/\/help$/);
  await expect(new AccountArea(page).user(email)).toBeVisible();

  await context.clearCookies();
  await page.goto(link);
  await expect(formAlert(page)).toContainText("This sign-in link has expired or was already used");
  await expect(signIn.linkForm).toBeVisible();
});

test("a signed-in player changes their password from the account page", async ({ page }) => {
  const email = newEmail("change");
  await signUp(page, "Player Kestrix-4", email);
  await page.getByRole("link", { name: "Player Kestrix-4" }).click();
  const form = page.getByRole("form", { name: "Change your password" });
  await form.getByLabel("Current password").fill("not-my-password");
  await form.getByLabel("New password").fill("another-long-password");
  await form.getByRole("button", { name: "Change password" }).click();
  await expect(formAlert(page)).toHaveText("Your current password is not right.");

  await form.getByLabel("Current password").fill(PASSWORD);
  await form.getByLabel("New password").fill("another-long-password");
  await form.getByRole("button", { name: "Change password" }).click();
  await expect(page.getByRole("main").getByRole("status")).toHaveText(
    "Your password is changed. You are still signed in here; everywhere else you are signed out.",
  );

  await signOut(page);
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(email, "another-long-password");
  await expect(new AccountArea(page).user("Player Kestrix-4")).toBeVisible();
});

test("pages carry the security headers", async ({ request }) => {
  const response = await request.get("/sign-in");
  const headers = response.headers();
  expect(headers["content-security-policy"]).toContain("frame-ancestors 'none'");
  expect(headers["content-security-policy"]).toContain("script-src 'self'");
  expect(headers["x-content-type-options"]).toBe("nosniff");
  expect(headers["referrer-policy"]).toBe("strict-origin-when-cross-origin");
  expect(headers["permissions-policy"]).toContain("camera=()");
});

async function sha256(value: string): Promise<string> {
  const digest = await crypto.subtle.digest("SHA-256", new TextEncoder().encode(value));
  return Buffer.from(digest).toString("hex");
}
