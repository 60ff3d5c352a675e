import { z } from "zod";

/** An e-mail as we store it: trimmed and lower-cased, so one address is one account. */
export const emailSchema = z
  .string({ error: "Enter your e-mail address." })
  .trim()
  .toLowerCase()
  .max(255, { error: "That e-mail address is too long." })
  .pipe(z.email({ error: "Enter a valid e-mail address, like you@example.com." }));

/** Where to go after signing in: a path on this site only, never another origin. */
export function safeCallbackUrl(raw: unknown): string {
  if (typeof raw !== "string" || !raw.startsWith("/") || raw.startsWith("//") || raw.startsWith("/\\")) return "/";
  try {
    const url = new URL(raw, "http://framefork.invalid");
    if (url.origin !== "http://framefork.invalid") return "/";
    return `${url.pathname}${url.search}${url.hash}`;
  } catch {
    return "/";
  }
}
