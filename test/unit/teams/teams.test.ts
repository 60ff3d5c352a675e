import { and, eq } from "drizzle-orm";
import { afterAll, describe, expect, test } from "vitest";
import { atLeast, getRole, requireRole } from "@/server/authz";
import { closeDb, getDb } from "@/server/db";
import { listAudit } from "@/server/db/queries/audit";
import { hashToken } from "@/server/tokens";
import {
  acceptInvite,
  createInvite,
  listPendingInvites,
  lookupInvite,
  revokeInvite,
} from "@/server/db/queries/invites";
import { changeRole, createTeam, listMembers, listMyTeams, removeMember, teamSlug } from "@/server/db/queries/teams";
import { invites, mailOutbox, memberships, ROLES } from "@/server/db/schema";
import { inviteMessage } from "@/server/invites";
import { makeUser } from "./fixtures";
import { mayInvite } from "@/lib/roles";

// Against the test MariaDB that `npm test` prepares; every test makes its own users and teams.
afterAll(closeDb);

const status = (p: Promise<unknown>) =>
  p.then(
    () => 200,
    (e: { status?: number }) => e.status ?? 500,
  );

describe("roles", () => {
  test("each role allows what the roles below it allow, and nothing above", () => {
    // The order owner > coach > player > viewer is the issue's, and each check is read from it.
    const order = ["viewer", "player", "coach", "owner"] as const;
    for (const [i, role] of order.entries()) {
      for (const [j, needed] of order.entries()) expect(atLeast(role, needed), `${role} vs ${needed}`).toBe(i >= j);
    }
    expect(ROLES.every((r) => !atLeast(null, r))).toBe(true);
  });

  test("coaches invite up to coach, owners anyone, players and viewers nobody", () => {
    expect(ROLES.filter((r) => mayInvite("owner", r))).toEqual([...ROLES]);
    expect(ROLES.filter((r) => mayInvite("coach", r))).toEqual(["coach", "player", "viewer"]);
    expect(ROLES.filter((r) => mayInvite("player", r) || mayInvite("viewer", r))).toEqual([]);
  });
});

describe("teams", () => {
  test("a slug is readable and different each time", () => {
    expect(teamSlug("Night Shift Crew!")).toMatch(/^night-shift-crew-[0-9a-f]{6}$/);
    expect(teamSlug("Ünïcode  Team")).toMatch(/^unicode-team-[0-9a-f]{6}$/);
    expect(teamSlug("!!!")).toMatch(/^team-[0-9a-f]{6}$/);
    expect(teamSlug("a")).not.toBe(teamSlug("a"));
  });

  test("the creator is the first owner, and the log says who made it", async () => {
    const owner = await makeUser("owner");
    const team = await createTeam({ name: "Rust Belt Dojo", ownerId: owner.id });
    expect(await listMyTeams({ userId: owner.id })).toEqual([{ ...team, role: "owner" }]);
    expect(await getRole({ teamId: team.id, userId: owner.id })).toBe("owner");
    const log = await listAudit({ teamId: team.id });
    expect(log.map((e) => [e.action, e.actorEmail])).toEqual([["team.created", owner.email]]);
  });

  test("requireRole: a stranger sees no team (404), a low role is refused (403)", async () => {
    const owner = await makeUser("owner");
    const stranger = await makeUser("stranger");
    const team = await createTeam({ name: "Checks", ownerId: owner.id });
    expect(await status(requireRole({ teamId: team.id, userId: stranger.id, needed: "viewer" }))).toBe(404);
    const { token } = await createInvite({
      teamId: team.id,
      invitedBy: owner.id,
      inviterRole: "owner",
      email: stranger.email,
      role: "viewer",
    });
    await acceptInvite({ token, userId: stranger.id, userEmail: stranger.email });
    expect(await status(requireRole({ teamId: team.id, userId: stranger.id, needed: "viewer" }))).toBe(200);
    expect(await status(requireRole({ teamId: team.id, userId: stranger.id, needed: "player" }))).toBe(403);
  });

  test("the last owner can neither step down nor leave; with a second owner they can", async () => {
    const a = await makeUser("owner");
    const b = await makeUser("coach");
    const team = await createTeam({ name: "Two Owners", ownerId: a.id });
    expect(await status(changeRole({ teamId: team.id, actorId: a.id, userId: a.id, role: "coach" }))).toBe(409);
    expect(await status(removeMember({ teamId: team.id, actorId: a.id, userId: a.id }))).toBe(409);

    const { token } = await createInvite({
      teamId: team.id,
      invitedBy: a.id,
      inviterRole: "owner",
      email: b.email,
      role: "coach",
    });
    await acceptInvite({ token, userId: b.id, userEmail: b.email });
    await changeRole({ teamId: team.id, actorId: a.id, userId: b.id, role: "owner" });
    await removeMember({ teamId: team.id, actorId: a.id, userId: a.id });
    expect((await listMembers({ teamId: team.id })).map((m) => [m.email, m.role])).toEqual([[b.email, "owner"]]);
    const actions = (await listAudit({ teamId: team.id })).map((e) => e.action);
    expect(actions).toEqual([
      "team.created",
      "member.invited",
      "invite.accepted",
      "member.role_changed",
      "member.left",
    ]);
  });
});

describe("invites", () => {
  test("only the token's hash is stored, and the link works once", async () => {
    const owner = await makeUser("owner");
    const player = await makeUser("player");
    const team = await createTeam({ name: "Invites", ownerId: owner.id });
    const { token, invite } = await createInvite({
      teamId: team.id,
      invitedBy: owner.id,
      inviterRole: "owner",
      email: ` ${player.email.toUpperCase()} `,
      role: "player",
    });
    expect(invite.email).toBe(player.email);
    expect(token.length).toBeGreaterThanOrEqual(43); // 32 random bytes in base64url
    const [row] = await getDb().select().from(invites).where(eq(invites.id, invite.id));
    expect(row!.tokenHash).toBe(hashToken(token));
    expect(JSON.stringify(row)).not.toContain(token);

    expect(await lookupInvite({ token })).toMatchObject({ status: "valid", teamName: "Invites", role: "player" });
    expect(await acceptInvite({ token, userId: player.id, userEmail: player.email })).toMatchObject({
      teamSlug: team.slug,
      role: "player",
    });
    expect(await lookupInvite({ token })).toEqual({ status: "used" });
    expect(await status(acceptInvite({ token, userId: player.id, userEmail: player.email }))).toBe(409);
    expect(await listPendingInvites({ teamId: team.id })).toEqual([]);
  });

  test("an invite is for the invited address, expires after 7 days, and can be withdrawn", async () => {
    const owner = await makeUser("owner");
    const invited = await makeUser("invited");
    const other = await makeUser("other");
    const team = await createTeam({ name: "Expiry", ownerId: owner.id });
    const made = new Date("2026-11-01T12:00:00Z");
    const { token } = await createInvite({
      teamId: team.id,
      invitedBy: owner.id,
      inviterRole: "owner",
      email: invited.email,
      role: "viewer",
      now: made,
    });

    // Someone else holding the token learns nothing from the answer: it is the one an unknown token gets.
    expect(await status(acceptInvite({ token, userId: other.id, userEmail: other.email, now: made }))).toBe(404);
    const justBefore = new Date(made.getTime() + 7 * 86_400_000 - 1000);
    expect((await lookupInvite({ token, now: justBefore })).status).toBe("valid");
    const after = new Date(made.getTime() + 7 * 86_400_000 + 1000);
    expect((await lookupInvite({ token, now: after })).status).toBe("expired");
    expect(await status(acceptInvite({ token, userId: invited.id, userEmail: invited.email, now: after }))).toBe(409);

    const second = await createInvite({
      teamId: team.id,
      invitedBy: owner.id,
      inviterRole: "owner",
      email: invited.email,
      role: "viewer",
    });
    await revokeInvite({ teamId: team.id, inviteId: second.invite.id, actorId: owner.id });
    expect((await lookupInvite({ token: second.token })).status).toBe("revoked");
    expect(await getRole({ teamId: team.id, userId: invited.id })).toBeNull();
    expect((await lookupInvite({ token: "not-a-real-token" })).status).toBe("unknown");
  });

  test("a coach cannot invite an owner, and a member cannot be invited again", async () => {
    const owner = await makeUser("owner");
    const coach = await makeUser("coach");
    const team = await createTeam({ name: "Limits", ownerId: owner.id });
    const { token } = await createInvite({
      teamId: team.id,
      invitedBy: owner.id,
      inviterRole: "owner",
      email: coach.email,
      role: "coach",
    });
    await acceptInvite({ token, userId: coach.id, userEmail: coach.email });
    const someone = await makeUser("someone");
    expect(
      await status(
        createInvite({
          teamId: team.id,
          invitedBy: coach.id,
          inviterRole: "coach",
          email: someone.email,
          role: "owner",
        }),
      ),
    ).toBe(403);
    expect(
      await status(
        createInvite({
          teamId: team.id,
          invitedBy: owner.id,
          inviterRole: "owner",
          email: coach.email,
          role: "player",
        }),
      ),
    ).toBe(409);
    // Nothing half-written by the refused ones.
    const pending = await getDb()
      .select()
      .from(invites)
      .where(and(eq(invites.teamId, team.id)));
    expect(pending).toHaveLength(1);
  });

  test("accepting a lower role keeps the higher one a member already has", async () => {
    const owner = await makeUser("owner");
    const coach = await makeUser("coach");
    const team = await createTeam({ name: "Keep Role", ownerId: owner.id });
    const first = await createInvite({
      teamId: team.id,
      invitedBy: owner.id,
      inviterRole: "owner",
      email: coach.email,
      role: "coach",
    });
    await acceptInvite({ token: first.token, userId: coach.id, userEmail: coach.email });
    // A second invite cannot be made for a member, so make the row directly as an old one would be.
    const token = `second-invite-${crypto.randomUUID()}`;
    await getDb()
      .insert(invites)
      .values({
        teamId: team.id,
        email: coach.email,
        role: "viewer",
        tokenHash: hashToken(token),
        invitedBy: owner.id,
        expiresAt: new Date(Date.now() + 86_400_000),
      });
    expect((await acceptInvite({ token, userId: coach.id, userEmail: coach.email })).role).toBe("coach");
  });
});

describe("invite e-mail", () => {
  test("the invite and its e-mail are written together: the message waits in the outbox with the link", async () => {
    const owner = await makeUser("owner");
    const member = await makeUser("member");
    const team = await createTeam({ name: "Outbox Crew", ownerId: owner.id });
    const address = `outbox-${team.slug}@example.test`;
    const { token } = await createInvite({
      teamId: team.id,
      invitedBy: owner.id,
      inviterRole: "owner",
      email: address,
      role: "player",
      mail: inviteMessage,
    });
    const queued = await getDb().select().from(mailOutbox).where(eq(mailOutbox.to, address));
    expect(queued).toHaveLength(1);
    // The team's and the inviter's names as stored, and the link carrying the token.
    expect(queued[0]!.subject).toBe(`${owner.name} invited you to Outbox Crew on Framefork`);
    expect(queued[0]!.text).toContain(`/invites/${token}`);
    expect(queued[0]!.sentAt).toBeNull();

    // A refused invite (already a member) leaves no message behind.
    await getDb().insert(memberships).values({ teamId: team.id, userId: member.id, role: "player" });
    await expect(
      createInvite({
        teamId: team.id,
        invitedBy: owner.id,
        inviterRole: "owner",
        email: member.email,
        role: "viewer",
        mail: inviteMessage,
      }),
    ).rejects.toMatchObject({ status: 409 });
    expect(await getDb().select().from(mailOutbox).where(eq(mailOutbox.to, member.email))).toEqual([]);
  });
});

describe("leaving and removal", () => {
  /** A team with an owner and a coach who has sent one invite that is still waiting. */
  async function coachWithInvite() {
    const owner = await makeUser("owner");
    const coach = await makeUser("coach");
    const team = await createTeam({ name: "Pending Invites", ownerId: owner.id });
    await getDb().insert(memberships).values({ teamId: team.id, userId: coach.id, role: "coach" });
    const invited = await makeUser("invited");
    const sent = await createInvite({
      teamId: team.id,
      invitedBy: coach.id,
      inviterRole: "coach",
      email: invited.email,
      role: "player",
    });
    return { owner, coach, team, invited, sent };
  }

  test("a removed member's waiting invites are withdrawn with them, and the log says so", async () => {
    const { owner, coach, team, invited, sent } = await coachWithInvite();
    // One the owner sent stays: only the removed member's invites go.
    const kept = await createInvite({
      teamId: team.id,
      invitedBy: owner.id,
      inviterRole: "owner",
      email: `kept-${team.slug}@example.test`,
      role: "viewer",
    });
    await removeMember({ teamId: team.id, actorId: owner.id, userId: coach.id });
    expect((await lookupInvite({ token: sent.token })).status).toBe("revoked");
    expect((await lookupInvite({ token: kept.token })).status).toBe("valid");
    expect(await status(acceptInvite({ token: sent.token, userId: invited.id, userEmail: invited.email }))).toBe(409);
    expect(await getRole({ teamId: team.id, userId: invited.id })).toBeNull();
    const log = await listAudit({ teamId: team.id });
    expect(log.at(-1)).toMatchObject({
      action: "invite.revoked",
      actorEmail: owner.email,
      detail: { email: invited.email, reason: "sender_removed" },
    });
    expect(log.at(-2)?.action).toBe("member.removed");
  });

  test("a member who leaves takes their waiting invites with them", async () => {
    const { coach, team, sent, invited } = await coachWithInvite();
    await removeMember({ teamId: team.id, actorId: coach.id, userId: coach.id });
    expect((await lookupInvite({ token: sent.token })).status).toBe("revoked");
    expect((await listAudit({ teamId: team.id })).at(-1)).toMatchObject({
      action: "invite.revoked",
      detail: { email: invited.email, reason: "sender_left" },
    });
    expect(await listPendingInvites({ teamId: team.id })).toEqual([]);
  });

  test("a demoted member's waiting invites their new role could not send are withdrawn; the rest stay", async () => {
    const { owner, coach, team, invited, sent } = await coachWithInvite();
    // An owner's invite to be an owner, and one to be a viewer: stepping down to coach keeps only the second.
    const other = await makeUser("second-owner");
    await getDb().insert(memberships).values({ teamId: team.id, userId: other.id, role: "owner" });
    const sentBy = (role: "owner" | "viewer") =>
      createInvite({
        teamId: team.id,
        invitedBy: other.id,
        inviterRole: "owner",
        email: `future-${role}-${team.slug}@example.test`,
        role,
      });
    const asOwner = await sentBy("owner");
    const asViewer = await sentBy("viewer");
    await changeRole({ teamId: team.id, actorId: owner.id, userId: other.id, role: "coach" });
    expect((await lookupInvite({ token: asOwner.token })).status).toBe("revoked");
    expect((await lookupInvite({ token: asViewer.token })).status).toBe("valid");

    // A coach made a player may send no invite at all: theirs go.
    await changeRole({ teamId: team.id, actorId: owner.id, userId: coach.id, role: "player" });
    expect((await lookupInvite({ token: sent.token })).status).toBe("revoked");
    expect((await listAudit({ teamId: team.id })).at(-1)).toMatchObject({
      action: "invite.revoked",
      detail: { email: invited.email, reason: "sender_demoted" },
    });
    // Promoted back, nothing returns: a withdrawn invite stays withdrawn.
    await changeRole({ teamId: team.id, actorId: owner.id, userId: coach.id, role: "coach" });
    expect((await lookupInvite({ token: sent.token })).status).toBe("revoked");
  });

  test("someone no longer in the team, or no longer an owner, changes nothing", async () => {
    const { owner, coach, team } = await coachWithInvite();
    const player = await makeUser("player");
    await getDb().insert(memberships).values({ teamId: team.id, userId: player.id, role: "player" });
    // The routes checked these people before; by the time their change runs, they have lost the role.
    expect(await status(changeRole({ teamId: team.id, actorId: coach.id, userId: player.id, role: "coach" }))).toBe(
      403,
    );
    expect(await status(removeMember({ teamId: team.id, actorId: coach.id, userId: player.id }))).toBe(403);
    await removeMember({ teamId: team.id, actorId: owner.id, userId: coach.id });
    expect(
      await status(
        createInvite({
          teamId: team.id,
          invitedBy: coach.id,
          inviterRole: "coach",
          email: `late-${team.slug}@example.test`,
          role: "viewer",
        }),
      ),
    ).toBe(403);
    expect(await getRole({ teamId: team.id, userId: player.id })).toBe("player");
    expect(await listPendingInvites({ teamId: team.id })).toEqual([]);
  });
});
