"use client";

import { mutate } from "swr";

/** next-auth's session endpoint: the signed-in user, or an empty object. */
export const SESSION_URL = "/api/auth/session";

/** Reads the session again wherever the header shows it: after signing out or renaming oneself. */
export function refreshSession(): void {
  void mutate((key) => Array.isArray(key) && key[0] === SESSION_URL);
}
