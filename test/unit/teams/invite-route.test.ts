import { randomUUID } from "node:crypto";
import { eq, inArray } from "drizzle-orm";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import type { SessionUser } from "@/server/auth";
import { closeDb, getDb } from "@/server/db";
import { createTeam } from "@/server/db/queries/teams";
import { invites, mailOutbox, memberships } from "@/server/db/schema";
import { drainOutbox } from "@/server/mail/outbox";
import { asUser } from "./parallel-session";
import { makeUser } from "./fixtures";

// POST /api/teams/[team]/invites as a browser calls it, against the test MariaDB. The SMTP step is
// replaced by one the test controls: it records, refuses, or hangs until let go. `deliverSoon`
// (which in production drains the outbox after the answer) is recorded, and each test drains only
// its own recipients: other test files queue and drain mail in the same database at the same time.
vi.mock("@/server/auth", () => import("./parallel-session"));
const mailServer = vi.hoisted(() => ({
  sent: [] as string[],
  refuse: new Set<string>(),
  hang: null as null | { to: string; reached: () => void; release: Promise<void> },
  deliverSoonCalls: 0,
}));
vi.mock("@/server/mail/send", () => ({
  sendMail: async ({ to }: { to: string }) => {
    const hang = mailServer.hang;
    if (hang && hang.to === to) {
      hang.reached();
      await hang.release;
    }
    if (mailServer.refuse.has(to)) throw new Error(`mail server refused ${to}`);
    mailServer.sent.push(to);
  },
}));
vi.mock("@/server/mail", async (original) => ({
  ...(await original<typeof import("@/server/mail")>()),
  deliverSoon: () => void (mailServer.deliverSoonCalls += 1),
}));

const { POST: invite } = await import("@/app/api/teams/[team]/invites/route");

const mine: string[] = [];
afterAll(async () => {
  // What this file queued and never sent is not left for the next drain (the browser tests' app).
  const db = getDb();
  if (mine.length) await db.delete(mailOutbox).where(inArray(mailOutbox.to, mine));
  await closeDb();
});
beforeEach(() => {
  mailServer.sent.length = 0;
  mailServer.refuse.clear();
  mailServer.hang = null;
  mailServer.deliverSoonCalls = 0;
});

type Handler = (request: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

function send(user: SessionUser, slug: string, body: { email: string; role: string }): Promise<Response> {
  mine.push(body.email);
  return asUser(user, () =>
    (invite as unknown as Handler)(
      new Request("http://test/api", {
        method: "POST",
        body: JSON.stringify(body),
        headers: { "content-type": "application/json" },
      }),
      { params: Promise.resolve({ team: slug }) },
    ),
  );
}

const outboxFor = (to: string[]) => getDb().select().from(mailOutbox).where(inArray(mailOutbox.to, to));

describe("the invite e-mail goes out after the answer", () => {
  test("a hanging mail server does not hold the answer up: the mail is queued, then sent after", async () => {
    const owner = await makeUser("owner");
    const team = await createTeam({ name: "Slow Mail", ownerId: owner.id });
    const to = `slow-${team.slug}@example.test`;
    let reached!: () => void;
    let release!: () => void;
    const mailReached = new Promise<"mail server reached first">(
      (r) => (reached = () => r("mail server reached first")),
    );
    mailServer.hang = { to, reached, release: new Promise<void>((r) => (release = r)) };

    const answer = send(owner, team.slug, { email: to, role: "player" });
    const first = await Promise.race([answer, mailReached]);
    if (!(first instanceof Response)) release(); // let a waiting answer finish before failing
    expect(first, "the answer waited for the mail server").toBeInstanceOf(Response);
    expect((first as Response).status).toBe(201);
    // Queued with the invite, not sent yet; the route asked for delivery after its commit.
    const [queued] = await outboxFor([to]);
    expect(queued?.sentAt).toBeNull();
    expect(mailServer.deliverSoonCalls).toBe(1);

    // The drain that `deliverSoon` starts sends it, however long the mail server takes.
    const drained = drainOutbox({ to: [to] });
    await mailReached;
    release();
    await drained;
    expect(mailServer.sent).toEqual([to]);
    expect((await outboxFor([to]))[0]?.sentAt).toBeInstanceOf(Date);
  });

  test("when the mail server refuses, the invite stands and its message waits to be tried again", async () => {
    const owner = await makeUser("owner");
    const team = await createTeam({ name: "Mail Down", ownerId: owner.id });
    const to = `refused-${team.slug}@example.test`;
    mailServer.refuse.add(to);
    const res = await send(owner, team.slug, { email: to, role: "player" });
    expect(res.status).toBe(201);
    expect(await getDb().select().from(invites).where(eq(invites.email, to))).toHaveLength(1);

    expect(await drainOutbox({ to: [to] })).toEqual({ sent: 0, failed: 1 });
    const [queued] = await outboxFor([to]);
    expect(queued?.sentAt).toBeNull();
    expect(queued?.lastError).toContain("mail server refused");
    expect(queued!.nextAttemptAt.getTime()).toBeGreaterThan(Date.now());
    // Once the mail server takes mail again, the next due drain sends it.
    mailServer.refuse.clear();
    await drainOutbox({ to: [to], now: new Date(Date.now() + 3_600_000) });
    expect(mailServer.sent).toEqual([to]);
  });
});

describe("invites are limited per sender and per team", () => {
  const body = (label: string, i: number) => ({
    email: `${label}-${i}-${randomUUID().slice(0, 8)}@example.test`,
    role: "viewer",
  });

  test("a sender's 21st invite in an hour is refused with 429 in the error format, and writes nothing", async () => {
    const coach = await makeUser("coach");
    const owner = await makeUser("owner");
    const team = await createTeam({ name: "Busy Coach", ownerId: owner.id });
    await getDb().insert(memberships).values({ teamId: team.id, userId: coach.id, role: "coach" });
    for (let i = 0; i < 20; i++) expect((await send(coach, team.slug, body("roster", i))).status).toBe(201);

    const over = body("one-too-many", 20);
    const res = await send(coach, team.slug, over);
    expect(res.status).toBe(429);
    const answer = (await res.json()) as { error: { code: string; message: string } };
    expect(answer.error.code).toBe("rate_limited");
    expect(answer.error.message).toMatch(/try again in \d+ minutes?/);
    expect(await getDb().select().from(invites).where(eq(invites.email, over.email))).toEqual([]);
    expect(await outboxFor([over.email])).toEqual([]);
    // The owner of the same team still has their own allowance.
    expect((await send(owner, team.slug, body("owner", 0))).status).toBe(201);
  });

  test("a team's 51st invite in an hour is refused, and strangers' tries do not use the team's allowance", async () => {
    const owner = await makeUser("owner");
    const team = await createTeam({ name: "Busy Team", ownerId: owner.id });
    const coaches = [await makeUser("coach"), await makeUser("coach")];
    await getDb()
      .insert(memberships)
      .values(coaches.map((c) => ({ teamId: team.id, userId: c.id, role: "coach" as const })));
    const stranger = await makeUser("stranger");
    for (let i = 0; i < 60; i++) expect((await send(stranger, team.slug, body("probe", i))).status).toBe(404);

    // 20 + 20 + 10: each sender within their own limit, the team at 50.
    const senders = [...coaches.map((c) => [c, 20] as const), [owner, 10] as const];
    for (const [sender, n] of senders)
      for (let i = 0; i < n; i++) expect((await send(sender, team.slug, body("team", i))).status).toBe(201);
    expect((await send(owner, team.slug, body("fifty-first", 0))).status).toBe(429);
  });
});
