import "server-only";
import { unstable_rethrow } from "next/navigation";
import type { z } from "zod";
import { AppError, type ErrorCode } from "@/lib/errors";
import { requireUser, type SessionUser } from "@/server/auth";
import { isPublishedEditionWrite, publishedEdition } from "@/server/db/published";
import { databaseUnavailable, isDatabaseDown } from "@/server/db/unavailable";

/** What every server action answers: a form shows `message`, or `error` and the field errors beside their inputs. */
export type ActionState =
  | { ok: true; message: string }
  | { ok: false; code: ErrorCode; error: string; fieldErrors?: Record<string, string> }
  | null;

function fieldErrors(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join(".") || "form";
    out[key] ??= issue.message;
  }
  return out;
}

async function run(fn: () => Promise<string>): Promise<ActionState> {
  try {
    return { ok: true, message: await fn() };
  } catch (error) {
    // redirect() and notFound() travel as thrown errors: let Next handle them.
    unstable_rethrow(error);
    if (error instanceof AppError) return { ok: false, code: error.code, error: error.message };
    if (isPublishedEditionWrite(error)) return { ok: false, code: "conflict", error: publishedEdition().message };
    if (isDatabaseDown(error)) {
      console.error("[action] the database is not answering:", error instanceof Error ? error.message : error);
      const unavailable = databaseUnavailable();
      return { ok: false, code: unavailable.code, error: unavailable.message };
    }
    console.error("[action] unexpected error:", error);
    return { ok: false, code: "internal", error: "Something went wrong on our side. Try again in a moment." };
  }
}

function parse<S extends z.ZodType>(
  schema: S,
  formData: FormData,
): { ok: true; data: z.infer<S> } | { ok: false; state: ActionState } {
  const parsed = schema.safeParse(Object.fromEntries(formData));
  if (parsed.success) return { ok: true, data: parsed.data };
  const errors = fieldErrors(parsed.error);
  return {
    ok: false,
    state: { ok: false, code: "bad_request", error: "Check the fields marked below.", fieldErrors: errors },
  };
}

/**
 * Every server action that needs no session goes through here: the form is
 * parsed with zod first; the action returns the sentence to show on success.
 */
export function validatedAction<S extends z.ZodType>(schema: S, action: (data: z.infer<S>) => Promise<string>) {
  return async (_previous: ActionState, formData: FormData): Promise<ActionState> => {
    const parsed = parse(schema, formData);
    if (!parsed.ok) return parsed.state;
    return run(() => action(parsed.data));
  };
}

/** The same, for actions of a signed-in user: parse, then the session (unauthorized without one). */
export function validatedActionWithUser<S extends z.ZodType>(
  schema: S,
  action: (data: z.infer<S>, user: SessionUser) => Promise<string>,
) {
  return async (_previous: ActionState, formData: FormData): Promise<ActionState> => {
    const parsed = parse(schema, formData);
    if (!parsed.ok) return parsed.state;
    return run(async () => action(parsed.data, await requireUser()));
  };
}
