import "server-only";
import { DrizzleAdapter } from "@auth/drizzle-adapter";
import type { NextAuthOptions } from "next-auth";
import type { Adapter } from "next-auth/adapters";
import CredentialsProvider from "next-auth/providers/credentials";
import EmailProvider from "next-auth/providers/email";
import { z } from "zod";
import { env } from "@/env";
import { AppError } from "@/lib/errors";
import { getDb } from "@/server/db";
import { accounts, sessions, users, verificationTokens } from "@/server/db/schema";
import { sendMail, signInLinkMail } from "@/server/mail";
import { verifyAgainstDummy, verifyPassword } from "./password";
import { findUserByEmail } from "./queries";
import { clientIp, passwordAttempt } from "./rate-limit";
import { emailSchema } from "./schemas";

export const MISMATCH = "That e-mail and password don't match.";
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
  return { id: user.id, email: user.email, name: user.name };
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
    session: { strategy: "jwt", maxAge: 30 * 24 * 60 * 60 },
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
          await sendMail({ to: identifier, ...signInLinkMail({ url }) });
        },
      }),
    ],
    pages: { signIn: "/sign-in", verifyRequest: "/check-email", error: "/sign-in" },
    callbacks: {
      jwt({ token, user }) {
        if (user) {
          token.sub = user.id;
          token.email = user.email;
          token.name = user.name;
        }
        return token;
      },
      session({ session, token }) {
        return { ...session, user: { id: token.sub, email: token.email, name: token.name ?? null } };
      },
    },
  };
  return built;
}
