import { createHash } from "node:crypto";
import NextAuth from "next-auth";
import type { NextRequest } from "next/server";
import { env } from "@/env";
import { AppError } from "@/lib/errors";
import { authOptions } from "@/server/auth/options";
import { refusedAuthInput } from "@/server/auth/next-auth-input";
import { clientIp, limitMail } from "@/server/auth/rate-limit";
import { emailSchema } from "@/server/auth/schemas";

type Context = { params: Promise<{ nextauth: string[] }> };

/**
 * next-auth answers a refused sign-in with `{ url }` pointing at the sign-in
 * page with `?error=`; its client reads the message from there.
 */
function refuse(error: AppError): Response {
  const url = new URL("/sign-in", env().NEXTAUTH_URL);
  url.searchParams.set("error", error.message);
  return Response.json({ url: url.toString() }, { status: error.status, headers: error.headers });
}

/** The POST body as next-auth reads it: a URL-encoded form (refusedAuthInput has refused JSON already). */
async function readBody(request: Request): Promise<Record<string, unknown> | null> {
  const type = request.headers.get("content-type") ?? "";
  if (!type.includes("application/x-www-form-urlencoded")) return null;
  return Object.fromEntries(new URLSearchParams(await request.clone().text()));
}

/**
 * Whether next-auth will accept this POST's CSRF token, checked as next-auth 4 checks it
 * (next-auth/core/lib/csrf-token.js): its cookie holds `token|hash` with hash the SHA-256 hex of
 * token + secret, and the form's `csrfToken` must be that token. The cookie is `__Host-` prefixed
 * when NEXTAUTH_URL is https (next-auth/core/lib/cookie.js).
 */
function csrfTokenAccepted(request: NextRequest, body: Record<string, unknown>): boolean {
  const { NEXTAUTH_URL, NEXTAUTH_SECRET } = env();
  const name = `${NEXTAUTH_URL.startsWith("https://") ? "__Host-" : ""}next-auth.csrf-token`;
  const [token, hash] = (request.cookies.get(name)?.value ?? "").split("|");
  if (!token || !hash || body.csrfToken !== token) return false;
  return createHash("sha256").update(`${token}${NEXTAUTH_SECRET}`).digest("hex") === hash;
}

/**
 * A sign-in link request spends the sign-in link budgets (limitMail) before next-auth sends
 * anything; the answer is the same whether or not the account exists (next-auth then sends a
 * link either way). Only a request next-auth will act on spends them: next-auth checks the CSRF
 * token inside its handler, after this, so the same check is made here first, and a request that
 * fails it goes to next-auth untouched, which refuses it. (The limit cannot move after next-auth's
 * check into the Email provider's sendVerificationRequest: next-auth turns any error thrown there
 * into a bare "EmailSignin", so the wait could not be shown.)
 */
async function limitLinkRequest(request: NextRequest): Promise<Response | null> {
  const body = await readBody(request);
  if (!body) return refuse(new AppError("bad_request", "Enter a valid e-mail address."));
  if (!csrfTokenAccepted(request, body)) return null;
  const email = emailSchema.safeParse(body.email);
  if (!email.success)
    return refuse(new AppError("bad_request", email.error.issues[0]?.message ?? "Enter a valid e-mail address."));
  try {
    await limitMail("signInLink", email.data, clientIp(request.headers));
  } catch (error) {
    if (error instanceof AppError) return refuse(error);
    throw error;
  }
  return null;
}

async function handler(request: NextRequest, context: Context): Promise<Response> {
  const { nextauth } = await context.params;
  const wrong = await refusedAuthInput(request, nextauth);
  if (wrong) return refuse(wrong);
  if (request.method === "POST" && nextauth.join("/") === "signin/email") {
    const refused = await limitLinkRequest(request);
    if (refused) return refused;
  }
  return (NextAuth(authOptions()) as (request: NextRequest, context: Context) => Promise<Response>)(request, context);
}

export { handler as GET, handler as POST };
