import { randomUUID } from "node:crypto";
import { expect, type Browser, type Locator, type Page } from "@playwright/test";
import { query } from "../db";
import { signUpAndConfirm } from "./auth-pages";

export const PASSWORD = "frame-trap-drills";

/** Signs a new person up through the form, confirms the address, and waits until the header shows them. */
export async function signUpAs(page: Page, name: string, email: string, callbackUrl?: string) {
  await signUpAndConfirm(page, { name, email, password: PASSWORD }, callbackUrl);
}

/**
 * A new person in their own browser context, signed up and put into the team as a player (as
 * an accepted invite would): the page they read with.
 */
export async function joinAsPlayer(browser: Browser, teamName: string, name: string): Promise<Page> {
  const page = await (await browser.newContext()).newPage();
  const email = `player-${randomUUID().slice(0, 8)}@example.test`;
  await signUpAs(page, name, email, "/teams");
  await query(
    `insert into memberships (team_id, user_id, role)
     select t.id, u.id, 'player' from teams t, users u where t.name = ? and u.email = ?`,
    [teamName, email],
  );
  return page;
}

/** /teams: the user's teams and "Start a team". */
export class TeamsPage {
  constructor(private readonly page: Page) {}
  async goto() {
    await this.page.goto("/teams");
  }
  async create(name: string): Promise<TeamPage> {
    const form = this.page.getByRole("form", { name: "Start a team" });
    await form.getByLabel("Team name").fill(name);
    await form.getByRole("button", { name: "Create team" }).click();
    await expect(this.page.getByRole("heading", { level: 1, name })).toBeVisible();
    return new TeamPage(this.page);
  }
}

/** /teams/[team]: members, invites, shared links, the team log. */
export class TeamPage {
  readonly members: Locator;
  readonly invite: Locator;
  readonly links: Locator;
  readonly log: Locator;
  readonly notice: Locator;
  constructor(private readonly page: Page) {
    this.members = page.getByTestId("team-members");
    this.invite = page.getByTestId("team-invite");
    this.links = page.getByTestId("team-links");
    this.log = page.getByTestId("team-log");
    this.notice = page.getByRole("status").filter({ hasText: /./ });
  }
  member(email: string): Locator {
    return this.members.locator(`tr[data-member="${email}"]`);
  }
  async inviteSomeone(email: string, role: "owner" | "coach" | "player" | "viewer") {
    await this.invite.getByLabel("E-mail").fill(email);
    await this.invite.getByLabel("Role").selectOption(role);
    await this.invite.getByRole("button", { name: "Send invite" }).click();
    await expect(this.page.getByText(`Invite sent to ${email}.`)).toBeVisible();
  }
}
