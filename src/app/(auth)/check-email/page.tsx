import type { Metadata } from "next";
import Link from "next/link";
import { AuthCard, first } from "../page-shell";

export const metadata: Metadata = { title: "Check your e-mail" };

export default async function CheckEmailPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const reset = first((await searchParams).for) === "reset";
  return (
    <AuthCard
      title="Check your e-mail"
      lead={
        reset
          ? "If an account uses that address, we sent it a link to choose a new password. The link works once, for 30 minutes."
          : "We sent a sign-in link to that address. Open it on this device to sign in; it works once, for 24 hours."
      }
    >
      <p className="text-sm text-ink-300">
        Nothing after a few minutes? Look in your spam folder, or{" "}
        <Link href={reset ? "/forgot-password" : "/sign-in"} className="text-accent underline underline-offset-2">
          ask for another link
        </Link>
        .
      </p>
    </AuthCard>
  );
}
