import { eq, inArray } from "drizzle-orm";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import type { SessionUser } from "@/server/auth";
import { closeDb, getDb } from "@/server/db";
import { createTeam } from "@/server/db/queries/teams";
import { invites, mailOutbox } from "@/server/db/schema";
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
