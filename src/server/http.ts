import "server-only";
import type { z } from "zod";
import { AppError, type ErrorIssue } from "@/lib/errors";

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

/**
 * Wraps a route handler: an `AppError` becomes its status and JSON body; any
 * other error is logged here and reaches the client only as a generic 500.
 */
export function handle<Args extends unknown[]>(fn: (...args: Args) => Promise<Response>) {
  return async (...args: Args): Promise<Response> => {
    try {
      return await fn(...args);
    } catch (error) {
      if (error instanceof AppError)
        return Response.json(error.toResponseBody(), { status: error.status, headers: error.headers });
      console.error("[api] unexpected error:", error);
      const internal = new AppError("internal", "Something went wrong on our side. Try again in a moment.");
      return Response.json(internal.toResponseBody(), { status: 500 });
    }
  };
}
