import "server-only";
import { DrizzleAdapter } from "@auth/drizzle-adapter";
import type { NextAuthOptions } from "next-auth";
import type { Adapter } from "next-auth/adapters";
import CredentialsProvider from "next-auth/providers/credentials";
import EmailProvider from "next-auth/providers/email";
import { z } from "zod";
import { env } from "@/env";
import { MISMATCH, UNCONFIRMED } from "@/lib/auth-messages";
import { AppError } from "@/lib/errors";
import { getDb } from "@/server/db";
import { accounts, sessions, users, verificationTokens } from "@/server/db/schema";
import { deliverSoon, queueMail, signInLinkMail } from "@/server/mail";
import { verifyAgainstDummy, verifyPassword } from "./password";
import { findUserByEmail, findUserById, voidUnprovenPassword } from "./queries";
import { clientIp, passwordAttempt } from "./rate-limit";
import { emailSchema } from "./schemas";
import { claimsFor, SESSION_MAX_AGE, sessionCookie, userForToken } from "./session";

export const SIGN_IN_LINK_MAX_AGE = 24 * 60 * 60;

const credentialsSchema = z.object({ email: emailSchema, password: z.string().min(1).max(1000) });

/** The Credentials provider's check: limits first, then one verify whether or not the account exists. */
export async function authorizePassword(credentials: unknown, headers: Record<string, string | string[] | undefined>) {
  const parsed = credentialsSchema.safeParse(credentials);
  if (!parsed.success) throw new AppError("bad_request", "Enter your e-mail and password.");
  const { email, password } = parsed.data;
  const attempt = await passwordAttempt(email, clientIp(headers));
  const user = await findUserByEmail({ email });
  const ok = user?.passwordHash
    ? await verifyPassword(user.passwordHash, password)
    : await verifyAgainstDummy(password);
  if (!user || !ok) throw new AppError("unauthorized", MISMATCH);
  await attempt.succeeded();
  // The right password, but nobody has shown they own the address yet: no session until they do.
  // Only someone who knows the password learns this (the form offers to send the link again).
  if (!user.emailVerified) throw new AppError("forbidden", UNCONFIRMED);
  return { id: user.id, email: user.email, name: user.name, sessionVersion: user.sessionVersion };
}

// Our tables use DATETIME where the adapter's types name TIMESTAMP; drizzle maps
// both to a JS Date, which is all the adapter reads and writes.
const adapterTables = {
  usersTable: users,
  accountsTable: accounts,
  sessionsTable: sessions,
  verificationTokensTable: verificationTokens,
} as unknown as Parameters<typeof DrizzleAdapter<ReturnType<typeof getDb>>>[1];

let built: NextAuthOptions | undefined;

/** next-auth's configuration, built on first use so `next build` needs no secret or database. */
export function authOptions(): NextAuthOptions {
  if (built) return built;
  const e = env();
  built = {
    secret: e.NEXTAUTH_SECRET,
    session: { strategy: "jwt", maxAge: SESSION_MAX_AGE },
    // Named here so a session started by a server action (session.ts) is the cookie next-auth reads.
    cookies: { sessionToken: sessionCookie() },
    adapter: DrizzleAdapter(getDb(), adapterTables) as Adapter,
    providers: [
      CredentialsProvider({
        id: "credentials",
        name: "E-mail and password",
        credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
        authorize: (credentials, req) => authorizePassword(credentials, req.headers ?? {}),
      }),
      EmailProvider({
        from: e.MAIL_FROM,
        maxAge: SIGN_IN_LINK_MAX_AGE,
        async sendVerificationRequest({ identifier, url }) {
          await queueMail(getDb(), { to: identifier, ...signInLinkMail({ url }) });
          deliverSoon();
        },
      }),
    ],
    pages: { signIn: "/sign-in", verifyRequest: "/check-email", error: "/sign-in" },
    callbacks: {
      /**
       * A sign-in by e-mailed link, when its link is used (not when it is asked for:
       * `email.verificationRequest`). `user` still holds the account as it was before this
       * sign-in, since next-auth marks the address proven only after this callback.
       */
      async signIn({ user, account, email }) {
        if (account?.type === "email" && !email?.verificationRequest && user.email)
          await voidUnprovenPassword({ email: user.email });
        return true;
      },
      /**
       * The token is made once, at sign-in (`user` is set only then), with the session version
       * of that moment; it is never changed later, so a browser cannot ask for a newer version
       * with next-auth's `update()`.
       */
      async jwt({ token, user }) {
        if (!user) return token;
        // authorizePassword returns the version it read with the password; the link sign-in's
        // user is the adapter's fresh row, read after signIn above moved the version on.
        const version = (user as { sessionVersion?: unknown }).sessionVersion;
        const sessionVersion =
          typeof version === "number" ? version : ((await findUserById({ id: user.id }))?.sessionVersion ?? 0);
        return {
          ...token,
          ...claimsFor({ id: user.id, email: user.email ?? "", name: user.name ?? null, sessionVersion }),
        };
      },
      /** Every read of the session checks the token against the database (session.ts). */
      async session({ session, token }) {
        const user = await userForToken(token);
        return user ? { ...session, user } : { expires: session.expires };
      },
    },
  };
  return built;
}
