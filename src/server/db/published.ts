import "server-only";
import { AppError } from "@/lib/errors";

/**
 * The mark the database's triggers (drizzle/0004) put at the start of their refusal when a write
 * reaches a row of a published Edition. Every write path checks the Edition's status first and
 * says so itself; the triggers are the backstop that holds whatever path a write takes.
 */
export const PUBLISHED_MARK = "FRAMEFORK_EDITION_PUBLISHED";

export const PUBLISHED_MESSAGE =
  "This Edition is published, and a published Edition never changes. Start a new Edition to edit.";

/** Whether a database error is a trigger refusing a write to a published Edition. */
export function isPublishedEditionWrite(error: unknown): boolean {
  for (let e: unknown = error, depth = 0; e instanceof Error && depth < 5; e = e.cause, depth++) {
    const { code, sqlMessage } = e as { code?: unknown; sqlMessage?: unknown };
    if (code === "ER_SIGNAL_EXCEPTION" && typeof sqlMessage === "string" && sqlMessage.startsWith(PUBLISHED_MARK))
      return true;
  }
  return false;
}

/** What a route or form answers when a write reached a published Edition. */
export function publishedEdition(): AppError {
  return new AppError("conflict", PUBLISHED_MESSAGE);
}
