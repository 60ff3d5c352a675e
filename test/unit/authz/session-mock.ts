import { AppError } from "@/lib/errors";
import type { SessionUser } from "@/server/auth";

// Stands in for @/server/auth in the route tests: `vi.mock("@/server/auth", () => import("./session-mock"))`.
// Route handlers read the session only through that module, so setting it here is all a test needs.
let current: SessionUser | null = null;

export function setSession(user: SessionUser | null): void {
  current = user;
}

export async function auth(): Promise<SessionUser | null> {
  return current;
}

export async function requireUser(): Promise<SessionUser> {
  if (!current) throw new AppError("unauthorized", "Sign in to do this.");
  return current;
}
