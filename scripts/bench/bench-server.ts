/**
 * What the browser and load benches share to run the production server: its settings (the
 * benches send no mail, so nothing listens on the SMTP port) and a wait until it answers.
 */
import { DATABASE_URL, DB } from "./bench-db";

/** The app's environment for a bench server at `base`, on the benches' MariaDB. */
export function benchAppEnv(base: string) {
  const app = {
    SMTP_URL: "smtp://127.0.0.1:1127",
    MAIL_FROM: "Framefork bench <no-reply@example.com>",
    NEXTAUTH_URL: base,
    NEXTAUTH_SECRET: "framefork-bench-only-secret-not-for-real-use",
  };
  return { app, env: { ...process.env, ...DB, ...app, DATABASE_URL, NEXT_TELEMETRY_DISABLED: "1" } };
}

/** Resolves once `url` answers 2xx; throws after `ms`. */
export async function waitFor(url: string, ms: number) {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} did not answer in ${ms} ms`);
}
