import { randomUUID } from "node:crypto";
import { expect, type Locator, type Page } from "@playwright/test";
import { linkIn, waitForMailAbout } from "../mail";

export const MISMATCH = "That e-mail and password don't match.";

/** A fresh address per test, so no test depends on another's account or mail. */
export const newEmail = (tag: string) => `${tag}-${randomUUID().slice(0, 8)}@example.test`;

/** A form's error: an alert inside the page's main content (Next's route announcer is an alert too). */
export function formAlert(page: Page): Locator {
  return page.getByRole("main").getByRole("alert");
}

/** The header's account area: sign in / sign up, or the user's name and Sign out. */
export class AccountArea {
  readonly root: Locator;
  readonly signOut: Locator;
  readonly signInLink: Locator;

  constructor(page: Page) {
    this.root = page.getByRole("navigation", { name: "Main" });
    this.signOut = this.root.getByRole("button", { name: "Sign out" });
    this.signInLink = this.root.getByRole("link", { name: "Sign in" });
  }

  user(name: string): Locator {
    return this.root.getByRole("link", { name });
  }
}

/** /sign-up */
export class SignUpPage {
  readonly form: Locator;
  constructor(private readonly page: Page) {
    this.form = page.getByRole("form", { name: "Create your account" });
  }
  async goto(callbackUrl?: string) {
    await this.page.goto(callbackUrl ? `/sign-up?callbackUrl=${encodeURIComponent(callbackUrl)}` : "/sign-up");
  }
  async signUp({ name, email, password }: { name: string; email: string; password: string }) {
    await this.form.getByLabel("Name").fill(name);
    await this.form.getByLabel("E-mail").fill(email);
    await this.form.getByLabel("Password").fill(password);
    await this.form.getByRole("button", { name: "Create account" }).click();
  }
}

export const CONFIRM_SUBJECT = "Confirm your e-mail address";

/** Opens the newest confirmation mail's link, confirms, and follows "Continue" (signed in by then). */
export async function confirmAddress(page: Page, email: string) {
  await page.goto(linkIn(await waitForMailAbout(email, CONFIRM_SUBJECT)));
  await page.getByRole("button", { name: "Confirm my address" }).click();
  await expect(page.getByRole("heading", { name: "Your address is confirmed" })).toBeVisible();
  await page.getByRole("main").getByRole("link", { name: "Continue" }).click();
}

/** Signs a new person up through the form, confirms the address from the mail, and waits until the header shows them. */
export async function signUpAndConfirm(
  page: Page,
  { name, email, password }: { name: string; email: string; password: string },
  callbackUrl?: string,
) {
  const form = new SignUpPage(page);
  await form.goto(callbackUrl);
  await form.signUp({ name, email, password });
  await expect(page.getByRole("heading", { name: "Check your e-mail" })).toBeVisible();
  await confirmAddress(page, email);
  await expect(new AccountArea(page).user(name)).toBeVisible();
}

/** /sign-in: the password form and the "e-mail me a link" form. */
export class SignInPage {
  readonly passwordForm: Locator;
  readonly linkForm: Locator;
  readonly alert: Locator;
  constructor(private readonly page: Page) {
    this.passwordForm = page.getByRole("form", { name: "Sign in with password" });
    this.linkForm = page.getByRole("form", { name: "E-mail me a sign-in link" });
    this.alert = formAlert(page);
  }
  async goto(callbackUrl?: string) {
    await this.page.goto(callbackUrl ? `/sign-in?callbackUrl=${encodeURIComponent(callbackUrl)}` : "/sign-in");
  }
  async signIn(email: string, password: string) {
    await this.passwordForm.getByLabel("E-mail").fill(email);
    await this.passwordForm.getByLabel("Password").fill(password);
    await this.passwordForm.getByRole("button", { name: "Sign in" }).click();
  }
  async askForLink(email: string) {
    await this.linkForm.getByLabel("E-mail").fill(email);
    await this.linkForm.getByRole("button", { name: "E-mail me a sign-in link" }).click();
  }
}

/** /forgot-password and /reset-password */
export class PasswordResetPages {
  constructor(private readonly page: Page) {}
  async askForReset(email: string) {
    await this.page.goto("/forgot-password");
    const form = this.page.getByRole("form", { name: "Reset your password" });
    await form.getByLabel("E-mail").fill(email);
    await form.getByRole("button", { name: "E-mail me a reset link" }).click();
  }
  async chooseNewPassword(password: string) {
    const form = this.page.getByRole("form", { name: "Choose a new password" });
    await form.getByLabel("New password").fill(password);
    await form.getByRole("button", { name: "Save the new password" }).click();
  }
}
