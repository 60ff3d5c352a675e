import { and, count, eq } from "drizzle-orm";
import { afterAll, describe, expect, test, vi } from "vitest";
import type { SessionUser } from "@/server/auth";
// Renamed here: the hooks lint rule reads any use… name as a React hook.
import { createPasswordReset, usePasswordReset as redeemReset } from "@/server/auth/queries";
import { closeDb, getDb } from "@/server/db";
import { listAudit } from "@/server/db/queries/audit";
import { createInvite } from "@/server/db/queries/invites";
import { createTeam } from "@/server/db/queries/teams";
import { invites, memberships, users, type Role } from "@/server/db/schema";
import { asUser } from "./parallel-session";
import { makeUser } from "./fixtures";

// The invariants that must hold when people act at the same moment. Every call here is a real
// request to a route handler (each with its own signed-in user) or a real query, run two at a
// time with Promise.all against the test MariaDB, so each gets its own pooled connection and the
// database decides the order. Races are repeated with fresh teams, since one run may not overlap.
vi.mock("@/server/auth", () => import("./parallel-session"));

const { PATCH: changeMember, DELETE: removeMember } = await import("@/app/api/teams/[team]/members/[user]/route");
const { POST: accept } = await import("@/app/api/invites/accept/route");

afterAll(closeDb);

type Handler = (request: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
type Person = Awaited<ReturnType<typeof makeUser>>;

/** One request by `user`; resolves to the answer's status and error message, if any. */
async function request(
  user: SessionUser,
  handler: unknown,
  { method, params = {}, body }: { method: string; params?: Record<string, string>; body?: unknown },
): Promise<{ status: number; message?: string }> {
  return asUser(user, async () => {
    const req = new Request("http://test/api", {
      method,
      ...(body === undefined ? {} : { body: JSON.stringify(body), headers: { "content-type": "application/json" } }),
    });
    const res = await (handler as Handler)(req, { params: Promise.resolve(params) });
    const text = await res.text();
    const message = text ? (JSON.parse(text) as { error?: { message?: string } }).error?.message : undefined;
    return { status: res.status, message };
  });
}

async function owners(teamId: number): Promise<number> {
  const [row] = await getDb()
    .select({ n: count() })
    .from(memberships)
    .where(and(eq(memberships.teamId, teamId), eq(memberships.role, "owner")));
  return Number(row?.n ?? 0);
}

async function membership(teamId: number, userId: string): Promise<Role | null> {
  const [row] = await getDb()
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
  return row?.role ?? null;
}

/** A team with two owners, a and b. */
async function twoOwners(): Promise<{ team: { id: number; slug: string }; a: Person; b: Person }> {
  const a = await makeUser("owner");
  const b = await makeUser("owner");
  const team = await createTeam({ name: "Two Owners Racing", ownerId: a.id });
  await getDb().insert(memberships).values({ teamId: team.id, userId: b.id, role: "owner" });
  return { team, a, b };
}

const invite = (teamId: number, owner: Person, email: string, role: Role) =>
  createInvite({ teamId, invitedBy: owner.id, inviterRole: "owner", email, role });

describe("a team always keeps an owner", () => {
  const demote = (team: { slug: string }, actor: Person, target: Person) =>
    request(actor, changeMember, {
      method: "PATCH",
      params: { team: team.slug, user: target.id },
      body: { role: "coach" },
    });
  const remove = (team: { slug: string }, actor: Person, target: Person) =>
    request(actor, removeMember, { method: "DELETE", params: { team: team.slug, user: target.id } });

  // Two owners, each acting on the other (or both leaving) at the same moment. Each one alone
  // is allowed, since the other owner would remain; together they would leave none.
  const RACES = {
    "demote each other": (t: Awaited<ReturnType<typeof twoOwners>>) => [
      demote(t.team, t.a, t.b),
      demote(t.team, t.b, t.a),
    ],
    "remove each other": (t: Awaited<ReturnType<typeof twoOwners>>) => [
      remove(t.team, t.a, t.b),
      remove(t.team, t.b, t.a),
    ],
    "one demotes, the other removes": (t: Awaited<ReturnType<typeof twoOwners>>) => [
      demote(t.team, t.a, t.b),
      remove(t.team, t.b, t.a),
    ],
    "both leave": (t: Awaited<ReturnType<typeof twoOwners>>) => [remove(t.team, t.a, t.a), remove(t.team, t.b, t.b)],
  };

  test.each(Object.entries(RACES))("two owners %s at once: one wins, the other is refused", async (_, race) => {
    const rounds: { statuses: number[]; owners: number; answers: string }[] = [];
    for (let round = 0; round < 8; round++) {
      const t = await twoOwners();
      const answers = await Promise.all(race(t));
      rounds.push({
        statuses: answers.map((a) => a.status),
        owners: await owners(t.team.id),
        answers: JSON.stringify(answers),
      });
    }
    const lost = rounds.filter((r) => r.owners === 0).map((r) => r.statuses.join(", "));
    expect(lost, "rounds that left the team without an owner").toEqual([]);
    for (const r of rounds) {
      // The first change wins. The second is refused with a reason, never a 500: 409 when it
      // would remove the last owner, 403 when its author stopped being an owner meanwhile, and
      // 404 when its author was removed before the second request read their membership.
      expect(
        r.statuses.filter((s) => s === 200 || s === 204),
        r.answers,
      ).toHaveLength(1);
      expect(
        r.statuses.every((s) => [200, 204, 403, 404, 409].includes(s)),
        r.answers,
      ).toBe(true);
    }
  });
});

describe("an invite token works once", () => {
  test("the same link accepted twice at once: one joins, the other is told it was used", async () => {
    for (let round = 0; round < 8; round++) {
      const owner = await makeUser("owner");
      const invited = await makeUser("invited");
      const team = await createTeam({ name: "Double Click", ownerId: owner.id });
      const { token } = await invite(team.id, owner, invited.email, "player");
      const answers = await Promise.all([
        request(invited, accept, { method: "POST", body: { token } }),
        request(invited, accept, { method: "POST", body: { token } }),
      ]);
      expect(answers.map((a) => a.status).sort(), JSON.stringify(answers)).toEqual([200, 409]);
      expect(answers.find((a) => a.status === 409)?.message).toBe("This invite has already been used.");
      expect(await membership(team.id, invited.id)).toBe("player");
      const joined = (await listAudit({ teamId: team.id })).filter((e) => e.action === "invite.accepted");
      expect(joined).toHaveLength(1);
    }
  });
});

describe("a password reset token works once", () => {
  test("the same reset link used twice at once: exactly one sets the password", async () => {
    for (let round = 0; round < 8; round++) {
      const person = await makeUser("resetting");
      let token = "";
      await createPasswordReset({
        email: person.email,
        expiresInMinutes: 30,
        mail: (t) => {
          token = t;
          return { subject: "Reset", text: t, html: t };
        },
      });
      const results = await Promise.all([
        redeemReset({ token, passwordHash: "first-hash" }),
        redeemReset({ token, passwordHash: "second-hash" }),
      ]);
      expect([...results].sort()).toEqual(["used", "valid"]);
      const [row] = await getDb()
        .select({ passwordHash: users.passwordHash })
        .from(users)
        .where(eq(users.id, person.id));
      // The password is the one the winning call set, not a mix or the loser's.
      expect(row?.passwordHash).toBe(results[0] === "valid" ? "first-hash" : "second-hash");
    }
  });
});

describe("two invites for one person, accepted at once", () => {
  /** The person accepts both at the same moment: each must succeed, neither may fail on the other. */
  async function acceptBothAtOnce(person: Person, tokens: string[]) {
    const answers = await Promise.all(
      tokens.map((token) => request(person, accept, { method: "POST", body: { token } })),
    );
    expect(
      answers.map((x) => x.status),
      JSON.stringify(answers),
    ).toEqual([200, 200]);
  }

  test("invites to two teams: both accepts succeed and the person is in both", async () => {
    for (let round = 0; round < 8; round++) {
      const person = await makeUser("invited");
      const first = await makeUser("owner");
      const second = await makeUser("owner");
      const teamA = await createTeam({ name: "First Team", ownerId: first.id });
      const teamB = await createTeam({ name: "Second Team", ownerId: second.id });
      const a = await invite(teamA.id, first, person.email, "player");
      const b = await invite(teamB.id, second, person.email, "coach");
      await acceptBothAtOnce(person, [a.token, b.token]);
      expect(await membership(teamA.id, person.id)).toBe("player");
      expect(await membership(teamB.id, person.id)).toBe("coach");
    }
  });

  test("two invites to the same team: both succeed, and the higher role is kept", async () => {
    for (let round = 0; round < 8; round++) {
      const person = await makeUser("invited");
      const owner = await makeUser("owner");
      const team = await createTeam({ name: "Sent Twice", ownerId: owner.id });
      const low = await invite(team.id, owner, person.email, "viewer");
      const high = await invite(team.id, owner, person.email, "coach");
      await acceptBothAtOnce(person, [low.token, high.token]);
      expect(await membership(team.id, person.id)).toBe("coach");
      const rows = await getDb().select().from(invites).where(eq(invites.teamId, team.id));
      expect(rows.every((r) => r.acceptedBy === person.id)).toBe(true);
    }
  });
});
