import "server-only";
import { createHash, randomBytes } from "node:crypto";

/**
 * A secret for a link sent by e-mail (password reset, team invite): 32 random bytes as
 * base64url. Only `hashToken(token)` is stored, so a copy of the database opens nothing.
 */
export const newToken = (): string => randomBytes(32).toString("base64url");

export const hashToken = (token: string): string => createHash("sha256").update(token).digest("hex");
