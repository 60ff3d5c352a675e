import "server-only";
import { randomBytes } from "node:crypto";

/** Bytes of randomness in a permalink's slug: 144 bits, past any guessing. */
export const SLUG_BYTES = 18;

/** A new permalink slug: 18 random bytes as base64url (24 characters, no padding). */
export function newSlug(): string {
  return randomBytes(SLUG_BYTES).toString("base64url");
}
