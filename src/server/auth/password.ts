import "server-only";
import { hash, verify } from "@node-rs/argon2";
import { z } from "zod";

export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 200;

/** The one rule for a new password, shared by sign-up, reset and change. */
export const newPasswordSchema = z
  .string({ error: "Choose a password." })
  .min(PASSWORD_MIN, { error: `Use at least ${PASSWORD_MIN} characters for your password.` })
  .max(PASSWORD_MAX, { error: `Use at most ${PASSWORD_MAX} characters for your password.` });

/** argon2id (the library's default algorithm) with a random salt, as a PHC string. */
export async function hashPassword(password: string): Promise<string> {
  newPasswordSchema.parse(password);
  return hash(password);
}

/** The library's constant-time check; a malformed stored hash counts as no match. */
export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  if (password.length === 0 || password.length > PASSWORD_MAX) return false;
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

let dummy: Promise<string> | undefined;

/**
 * Spends one verify on a hash nobody can match, so a sign-in for an unknown
 * e-mail (or an account with no password) takes as long as a wrong password.
 */
export async function verifyAgainstDummy(password: string): Promise<false> {
  dummy ??= hash("framefork-no-account-has-this-password");
  await verifyPassword(await dummy, password.length > 0 ? password : "x");
  return false;
}
