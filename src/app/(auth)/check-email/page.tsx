import type { Metadata } from "next";
import Link from "next/link";
import { AuthCard, first } from "../page-shell";

export const metadata: Metadata = { title: "Check your e-mail" };

/**
 * What was sent, and how to get another. Sign-up and reset say the same whether or not the
 * address has an account: only the mail, which reaches the address's owner, says more.
 */
const SENT = {
  confirm: {
    lead: "We sent a link to that address. Open it to confirm the address is yours and finish creating your account; it works once, for 24 hours.",
    again: { href: "/sign-in", text: "sign in with your password to have a new one sent" },
  },
  reset: {
    lead: "If an account uses that address, we sent it a link to choose a new password. The link works once, for 30 minutes.",
    again: { href: "/forgot-password", text: "ask for another link" },
  },
  link: {
    lead: "We sent a sign-in link to that address. Open it on this device to sign in; it works once, for 24 hours.",
    again: { href: "/sign-in", text: "ask for another link" },
  },
};

export default async function CheckEmailPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const kind = first((await searchParams).for);
  const { lead, again } = SENT[kind === "reset" || kind === "confirm" ? kind : "link"];
  return (
    <AuthCard title="Check your e-mail" lead={lead}>
      <p className="text-sm text-ink-300">
        Nothing after a few minutes? Look in your spam folder, or{" "}
        <Link href={again.href} className="text-accent underline underline-offset-2">
          {again.text}
        </Link>
        .
      </p>
    </AuthCard>
  );
}
