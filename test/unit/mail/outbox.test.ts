import { randomUUID } from "node:crypto";
import { eq, inArray } from "drizzle-orm";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import { closeDb, getDb } from "@/server/db";
import { mailOutbox } from "@/server/db/schema";

// The SMTP step is replaced by a recorder that can be told to fail or to be slow; the queue
// itself runs against the test MariaDB. Other test files may queue mail at the same time, so
// every drain and every check is limited to this file's own recipients.
const delivered: string[] = [];
let failFor = new Set<string>();
let delayMs = 0;
vi.mock("@/server/mail/send", () => ({
  sendMail: async ({ to }: { to: string }) => {
    if (delayMs) await new Promise((r) => setTimeout(r, delayMs));
    if (failFor.has(to)) throw new Error(`mail server refused ${to}`);
    delivered.push(to);
  },
}));

const { MAX_ATTEMPTS, drainOutbox, queueMail, retryDelayMs } = await import("@/server/mail/outbox");

afterAll(closeDb);
beforeEach(() => {
  delivered.length = 0;
  failFor = new Set();
  delayMs = 0;
});

const address = () => `outbox-${randomUUID().slice(0, 8)}@example.test`;
const mail = (to: string) => ({ to, subject: "Test", text: "Plain", html: "<p>Plain</p>" });
const rowsFor = (to: string[]) => getDb().select().from(mailOutbox).where(inArray(mailOutbox.to, to));

describe("mail outbox", () => {
  test("a message queued in a transaction that rolls back is never sent", async () => {
    const to = address();
    await expect(
      getDb().transaction(async (tx) => {
        await queueMail(tx, mail(to));
        throw new Error("the change failed");
      }),
    ).rejects.toThrow("the change failed");
    await drainOutbox({ to: [to] });
    expect(await rowsFor([to])).toEqual([]);
    expect(delivered).not.toContain(to);
  });

  test("a committed message is sent once and marked sent", async () => {
    const to = address();
    await getDb().transaction((tx) => queueMail(tx, mail(to)));
    await drainOutbox({ to: [to] });
    await drainOutbox({ to: [to] });
    expect(delivered.filter((d) => d === to)).toHaveLength(1);
    const [row] = await rowsFor([to]);
    expect(row?.sentAt).toBeInstanceOf(Date);
    expect(row?.attempts).toBe(1);
  });

  test("a failed send waits, is tried again when due, and stops after the last attempt", async () => {
    const to = address();
    failFor.add(to);
    await queueMail(getDb(), mail(to));
    const started = Date.now();
    await drainOutbox({ to: [to] });
    let [row] = await rowsFor([to]);
    expect(row?.sentAt).toBeNull();
    expect(row?.attempts).toBe(1);
    expect(row?.lastError).toContain("mail server refused");
    // Not due yet: a drain now leaves it alone.
    expect(row!.nextAttemptAt.getTime()).toBeGreaterThanOrEqual(started + retryDelayMs(1) - 1000);
    await drainOutbox({ to: [to] });
    [row] = await rowsFor([to]);
    expect(row?.attempts).toBe(1);
    // Drains from the future find it due each time, until the last attempt.
    for (let i = 0; i < MAX_ATTEMPTS + 2; i++)
      await drainOutbox({ now: new Date(Date.now() + 7 * 3_600_000), to: [to] });
    [row] = await rowsFor([to]);
    expect(row?.attempts).toBe(MAX_ATTEMPTS);
    expect(row?.sentAt).toBeNull();
    // It works once the server takes it: nothing was lost, but no more tries are made by itself.
    failFor.clear();
    const db = getDb();
    await db.update(mailOutbox).set({ attempts: 0 }).where(eq(mailOutbox.to, to));
    await drainOutbox({ now: new Date(Date.now() + 7 * 3_600_000), to: [to] });
    expect(delivered).toContain(to);
  });

  test("two drains at once send each message exactly once", async () => {
    const to = [address(), address(), address(), address()];
    for (const t of to) await queueMail(getDb(), mail(t));
    delayMs = 50;
    await Promise.all([drainOutbox({ to }), drainOutbox({ to }), drainOutbox({ to })]);
    for (const t of to)
      expect(
        delivered.filter((d) => d === t),
        t,
      ).toHaveLength(1);
    expect((await rowsFor(to)).every((r) => r.sentAt && r.attempts === 1)).toBe(true);
  });

  test("a drain limited to some recipients leaves everyone else's mail alone", async () => {
    const mine = address();
    const theirs = address();
    for (const t of [mine, theirs]) await queueMail(getDb(), mail(t));
    await drainOutbox({ to: [mine] });
    expect(delivered).toEqual([mine]);
    const [other] = await rowsFor([theirs]);
    expect(other?.attempts).toBe(0);
    expect(other?.sentAt).toBeNull();
    await drainOutbox({ to: [theirs] });
  });

  test("the wait grows by doubling from one minute and stops growing at six hours", () => {
    expect([1, 2, 3, 4].map(retryDelayMs)).toEqual([60_000, 120_000, 240_000, 480_000]);
    expect(retryDelayMs(20)).toBe(6 * 3_600_000);
  });
});
