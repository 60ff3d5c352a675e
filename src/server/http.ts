import "server-only";
import type { z } from "zod";
import { env } from "@/env";
import { AppError, type ErrorIssue } from "@/lib/errors";
import { isPublishedEditionWrite, publishedEdition } from "@/server/db/published";
import { databaseUnavailable, isDatabaseDown, RETRY_AFTER_SECONDS } from "@/server/db/unavailable";

export const DEFAULT_MAX_BODY_BYTES = 1_000_000;

export function zodIssues(error: z.ZodError): ErrorIssue[] {
  return error.issues.map((i) => ({
    path: i.path.map((p) => (typeof p === "symbol" ? String(p) : p)),
    message: i.message,
  }));
}

/**
 * Reads a JSON body and validates it: 415 unless it is JSON, 413 past
 * `maxBytes` (counted while reading, so a lying Content-Length does not help),
 * 400 for malformed JSON or a body the schema refuses, with zod's issues.
 */
export async function readJson<S extends z.ZodType>(
  request: Request,
  schema: S,
  { maxBytes = DEFAULT_MAX_BODY_BYTES }: { maxBytes?: number } = {},
): Promise<z.infer<S>> {
  const type = request.headers.get("content-type") ?? "";
  if (!/^application\/(.+\+)?json\b/i.test(type)) {
    throw new AppError("unsupported_media_type", "Send the body as JSON (Content-Type: application/json).");
  }
  const declared = Number(request.headers.get("content-length") ?? 0);
  if (declared > maxBytes) throw tooLarge(maxBytes);

  const reader = request.body?.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  if (reader) {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      size += value.byteLength;
      if (size > maxBytes) {
        await reader.cancel();
        throw tooLarge(maxBytes);
      }
      chunks.push(value);
    }
  }
  const text = new TextDecoder().decode(Buffer.concat(chunks));
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    throw new AppError("bad_request", "The body is not valid JSON.");
  }
  return parseWith(schema, json, "body");
}

/** Validates path or query parameters: 400 with zod's issues when they do not fit. */
export function parseWith<S extends z.ZodType>(
  schema: S,
  input: unknown,
  where: "body" | "path" | "query",
): z.infer<S> {
  const parsed = schema.safeParse(input);
  if (!parsed.success) {
    const issues = zodIssues(parsed.error);
    throw new AppError(
      "bad_request",
      `Invalid ${where}: ${issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`,
      issues,
    );
  }
  return parsed.data;
}

function tooLarge(maxBytes: number) {
  return new AppError("payload_too_large", `The body is larger than ${Math.round(maxBytes / 1000)} kB.`);
}

const STATE_CHANGING = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/**
 * Why a request that changes something must be refused as coming from another
 * site, or null when it may go on: an `Origin` header that is not the app's
 * own (NEXTAUTH_URL's origin), or a browser's `Sec-Fetch-Site: cross-site`.
 * A request without either (curl, a server) passes: cookies are what a forged
 * cross-site request would abuse, and only browsers send them unasked.
 */
export function crossSiteRefusal(request: Pick<Request, "method" | "headers">): AppError | null {
  if (!STATE_CHANGING.has(request.method.toUpperCase())) return null;
  const origin = request.headers.get("origin");
  const ours = new URL(env().NEXTAUTH_URL).origin;
  if ((origin !== null && origin !== ours) || request.headers.get("sec-fetch-site") === "cross-site") {
    return new AppError("forbidden", "This request came from another site. Use Framefork's own pages to make changes.");
  }
  return null;
}

/**
 * Wraps a route handler: a change requested from another site is refused
 * (403); an `AppError` becomes its status and JSON body; a write the
 * database refused because its Edition is published becomes 409; MariaDB not
 * answering becomes 503 with a message that says so; any other error is
 * logged here and reaches the client only as a generic 500.
 */
export function handle<Args extends unknown[]>(fn: (...args: Args) => Promise<Response>) {
  return async (...args: Args): Promise<Response> => {
    const request = args[0];
    const refused = request instanceof Request ? crossSiteRefusal(request) : null;
    if (refused) return Response.json(refused.toResponseBody(), { status: refused.status });
    try {
      return await fn(...args);
    } catch (error) {
      if (error instanceof AppError)
        return Response.json(error.toResponseBody(), { status: error.status, headers: error.headers });
      if (isPublishedEditionWrite(error)) {
        const refused = publishedEdition();
        return Response.json(refused.toResponseBody(), { status: refused.status });
      }
      if (isDatabaseDown(error)) {
        console.error("[api] the database is not answering:", error instanceof Error ? error.message : error);
        const unavailable = databaseUnavailable();
        return Response.json(unavailable.toResponseBody(), {
          status: unavailable.status,
          headers: { "retry-after": String(RETRY_AFTER_SECONDS) },
        });
      }
      console.error("[api] unexpected error:", error);
      const internal = new AppError("internal", "Something went wrong on our side. Try again in a moment.");
      return Response.json(internal.toResponseBody(), { status: 500 });
    }
  };
}
