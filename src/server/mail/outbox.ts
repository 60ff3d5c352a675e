import "server-only";
import { and, asc, eq, inArray, isNull, lt, lte, sql } from "drizzle-orm";
import { after } from "next/server";
import { getDb } from "@/server/db";
import type { Executor } from "@/server/db/queries/audit";
import { mailOutbox } from "@/server/db/schema";
import { sendMail, type OutgoingMail } from "./send";

/**
 * Mail goes out in two steps. `queueMail` writes the message in the same transaction as the
 * change that calls for it (an invite, a reset link), so either both happen or neither; after
 * the commit, `deliverSoon` drains the queue once the answer has gone to the browser. A slow
 * or absent mail server therefore never holds a database connection or delays an answer, and
 * a message that fails is tried again with a growing wait.
 */

/** How many times a message is tried before it is left for an operator to look at. */
export const MAX_ATTEMPTS = 8;
/** While one drain sends a message, others leave it alone for this long (a crash mid-send frees it after). */
const LEASE_MS = 2 * 60_000;
const BATCH = 20;

/** The wait before try `attempt + 1`: 1, 2, 4 … minutes, at most six hours. */
export function retryDelayMs(attempt: number): number {
  return Math.min(2 ** Math.max(0, attempt - 1) * 60_000, 6 * 60 * 60_000);
}

/** Queues one message inside the caller's transaction (or on the pool, for a change of one row). */
export async function queueMail(executor: Executor, mail: OutgoingMail): Promise<void> {
  await executor.insert(mailOutbox).values({ to: mail.to, subject: mail.subject, text: mail.text, html: mail.html });
}

/**
 * Claims the due messages (rows another drain holds are skipped), then sends each outside any
 * transaction and marks it sent, or schedules the next try. Returns what happened. `to` limits
 * the drain to those recipients: tests share one database, and drain only their own messages.
 */
export async function drainOutbox({ now = new Date(), to }: { now?: Date; to?: string[] } = {}): Promise<{
  sent: number;
  failed: number;
}> {
  const db = getDb();
  const claimed = await db.transaction(async (tx) => {
    const due = await tx
      .select()
      .from(mailOutbox)
      .where(
        and(
          isNull(mailOutbox.sentAt),
          lte(mailOutbox.nextAttemptAt, now),
          lt(mailOutbox.attempts, MAX_ATTEMPTS),
          to ? inArray(mailOutbox.to, to) : undefined,
        ),
      )
      .orderBy(asc(mailOutbox.id))
      .limit(BATCH)
      .for("update", { skipLocked: true });
    if (due.length === 0) return [];
    await tx
      .update(mailOutbox)
      .set({ attempts: sql`${mailOutbox.attempts} + 1`, nextAttemptAt: new Date(now.getTime() + LEASE_MS) })
      .where(
        inArray(
          mailOutbox.id,
          due.map((m) => m.id),
        ),
      );
    return due;
  });

  let sent = 0;
  let failed = 0;
  for (const message of claimed) {
    try {
      await sendMail({ to: message.to, subject: message.subject, text: message.text, html: message.html });
      await db.update(mailOutbox).set({ sentAt: new Date() }).where(eq(mailOutbox.id, message.id));
      sent += 1;
    } catch (error) {
      failed += 1;
      const attempt = message.attempts + 1;
      await db
        .update(mailOutbox)
        .set({
          nextAttemptAt: new Date(Date.now() + retryDelayMs(attempt)),
          lastError: String((error as Error)?.message ?? error).slice(0, 500),
        })
        .where(eq(mailOutbox.id, message.id));
      console.error(`[mail] sending message ${message.id} failed (try ${attempt} of ${MAX_ATTEMPTS}):`, error);
    }
  }
  return { sent, failed };
}

async function drainQuietly(): Promise<void> {
  try {
    await drainOutbox();
  } catch (error) {
    console.error("[mail] draining the outbox failed:", error);
  }
}

/**
 * Sends what is queued once the current answer is out (Next's `after`); outside a request
 * (scripts, tests) it starts at once without waiting. Retries come from the periodic drain
 * started in `src/instrumentation.ts`.
 */
export function deliverSoon(): void {
  try {
    after(drainQuietly);
  } catch {
    void drainQuietly();
  }
}
