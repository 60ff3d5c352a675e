import type { Metadata } from "next";
import Link from "next/link";
import { resetTokenState } from "@/server/auth/queries";
import { ResetPasswordForm } from "../forms";
import { AuthCard, first } from "../page-shell";

export const metadata: Metadata = { title: "Choose a new password" };

const REFUSED = {
  used: "This reset link was already used.",
  expired: "This reset link has expired.",
  unknown: "This reset link is not valid: it may be incomplete, or an older one.",
} as const;

export default async function ResetPasswordPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const token = first((await searchParams).token) ?? "";
  const state = token && token.length <= 200 ? await resetTokenState({ token }) : "unknown";
  if (state !== "valid") {
    return (
      <AuthCard title="This link no longer works">
        <p role="alert" className="text-ink-200">
          {REFUSED[state]} Links work once, for 30 minutes.
        </p>
        <Link
          href="/forgot-password"
          className="inline-block rounded bg-accent px-4 py-2 font-semibold text-ink-950 no-underline hover:bg-accent-strong"
        >
          Send me a new link
        </Link>
      </AuthCard>
    );
  }
  return (
    <AuthCard title="Choose a new password">
      <ResetPasswordForm token={token} />
    </AuthCard>
  );
}
