import "server-only";
import { z } from "zod";
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
  const text = new TextDecoder().decode(await readBody(request, maxBytes, () => tooLarge(maxBytes)));
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

/**
 * The body's bytes, refused with `tooLarge()` past `maxBytes`: at once when Content-Length says
 * so, else counted while reading, so a lying or missing Content-Length does not help.
 */
async function readBody(request: Request, maxBytes: number, tooLarge: () => AppError): Promise<Buffer> {
  const declared = Number(request.headers.get("content-length") ?? 0);
  if (declared > maxBytes) throw tooLarge();
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
        throw tooLarge();
      }
      chunks.push(value);
    }
  }
  return Buffer.concat(chunks);
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

/**
 * Reads one file from a `multipart/form-data` body: 415 unless the body is a form, 413 once the
 * body passes `maxBytes` plus room for the form's own lines (counted while reading, so neither a
 * lying Content-Length nor a chunked body makes the server hold more), 400 without the field.
 * The file's own size is the caller's to check against its limit.
 */
export async function readUpload(
  request: Request,
  { field, maxBytes, tooLargeMessage }: { field: string; maxBytes: number; tooLargeMessage: string },
): Promise<File> {
  const type = request.headers.get("content-type") ?? "";
  if (!/^multipart\/form-data\b/i.test(type)) {
    throw new AppError(
      "unsupported_media_type",
      `Send the file as a form upload (Content-Type: multipart/form-data) in a field named “${field}”.`,
    );
  }
  const body = await readBody(
    request,
    maxBytes + FORM_OVERHEAD_BYTES,
    () => new AppError("payload_too_large", tooLargeMessage),
  );
  let form: FormData;
  try {
    form = await new Response(new Uint8Array(body), { headers: { "content-type": type } }).formData();
  } catch {
    throw new AppError("bad_request", "The body is not a readable form upload.");
  }
  const files = form.getAll(field);
  const file = files[0];
  if (files.length !== 1 || typeof file === "string" || file === undefined) {
    throw new AppError("bad_request", `Send exactly one file, in a form field named “${field}”.`);
  }
  return file;
}

/** A form's boundaries, headers and file name around the file itself. */
const FORM_OVERHEAD_BYTES = 16 * 1024;

const exportQuerySchema = z.strictObject({
  format: z.enum(["csv", "json"], "format is csv or json").optional(),
});

/** A download's format from the query: `?format=csv` (the default) or `?format=json`; 400 for anything else. */
export function exportFormat(request: Request): "csv" | "json" {
  return parseWith(exportQuerySchema, Object.fromEntries(new URL(request.url).searchParams), "query").format ?? "csv";
}

/**
 * A file to download: its content type, `attachment` with a file name, and caching that keeps a
 * team's data out of shared caches (`private, no-store`); the public demo may be cached a minute.
 */
export function fileResponse({
  text,
  format,
  name,
  isPublic,
}: {
  text: string;
  format: "csv" | "json";
  /** Without extension; only letters, digits and dashes (slugs). */
  name: string;
  isPublic: boolean;
}): Response {
  return new Response(text, {
    headers: {
      "content-type": format === "csv" ? "text/csv; charset=utf-8" : "application/json; charset=utf-8",
      "content-disposition": `attachment; filename="${name}.${format}"`,
      "cache-control": isPublic ? "public, max-age=60" : "private, no-store",
      "x-content-type-options": "nosniff",
    },
  });
}
