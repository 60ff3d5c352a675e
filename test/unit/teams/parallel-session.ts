import { AsyncLocalStorage } from "node:async_hooks";
import { AppError } from "@/lib/errors";
import type { SessionUser } from "@/server/auth";

// Stands in for @/server/auth when several people call route handlers at the same time:
// `vi.mock("@/server/auth", () => import("./parallel-session"))`, then `asUser(user, () => GET(...))`.
// Each call carries its own signed-in user (AsyncLocalStorage follows it through every await),
// so two requests in one Promise.all are two different people, as in production.
const signedIn = new AsyncLocalStorage<SessionUser | null>();

export function asUser<T>(user: SessionUser | null, call: () => T): T {
  return signedIn.run(user, call);
}

export async function auth(): Promise<SessionUser | null> {
  return signedIn.getStore() ?? null;
}

export async function requireUser(): Promise<SessionUser> {
  const user = signedIn.getStore();
  if (!user) throw new AppError("unauthorized", "Sign in to do this.");
  return user;
}
