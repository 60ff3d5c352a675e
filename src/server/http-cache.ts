import "server-only";
import { createHash } from "node:crypto";

/**
 * HTTP validators for JSON answers (RFC 9110 §8.8.3 and §13.1.2): a strong
 * ETag made from the body's bytes, and a 304 without a body when the client
 * already holds that body. The caller decides who may see the answer first:
 * a 304 says "what you hold is current", so it is given only to someone the
 * 200 would have been given to.
 */

/** A JSON body, serialised and encoded once (a kept body is sent many times), with its strong ETag. */
export interface JsonBody {
  bytes: Uint8Array<ArrayBuffer>;
  etag: string;
}

/** The body and its ETag: a quoted SHA-256 of the bytes, base64url (no quote or comma can appear inside). */
export function jsonBody(value: unknown): JsonBody {
  const bytes = new TextEncoder().encode(JSON.stringify(value));
  return { bytes, etag: `"${createHash("sha256").update(bytes).digest("base64url")}"` };
}

// RFC 9110 §8.8.3: entity-tag = [ "W/" ] DQUOTE *etagc DQUOTE, etagc = %x21 / %x23-7E / obs-text.
const ENTITY_TAG = String.raw`(?:W/)?"[\x21\x23-\x7e\x80-\xff]*"`;
const TAG_LIST = new RegExp(String.raw`^\s*${ENTITY_TAG}(?:\s*,\s*${ENTITY_TAG})*\s*$`);

/**
 * Whether an If-None-Match header names this ETag (RFC 9110 §13.1.2): "*", or
 * a list of entity tags one of which matches by the weak comparison (W/ is
 * ignored). A header that is not such a list matches nothing, so the full
 * answer goes out.
 */
export function ifNoneMatchHits(header: string | null, etag: string): boolean {
  if (header === null) return false;
  if (header.trim() === "*") return true;
  if (!TAG_LIST.test(header)) return false;
  const tags: string[] = header.match(/"[^"]*"/g) ?? [];
  return tags.includes(etag);
}

/**
 * The answer to a GET for `body`: 304 with no body when the request's
 * If-None-Match names its ETag, else 200 with the JSON. Both carry the ETag
 * and the same caching headers (RFC 9110 §15.4.5).
 */
export function jsonWithEtag(request: Request, body: JsonBody, headers: Record<string, string>): Response {
  const common = { ...headers, etag: body.etag };
  // Next compresses the answer itself, per request: it drops a Content-Encoding set here.
  if (ifNoneMatchHits(request.headers.get("if-none-match"), body.etag)) {
    return new Response(null, { status: 304, headers: common });
  }
  return new Response(body.bytes, { status: 200, headers: { ...common, "content-type": "application/json" } });
}
