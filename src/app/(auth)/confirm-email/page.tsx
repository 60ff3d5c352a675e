import type { Metadata } from "next";
import Link from "next/link";
import { auth } from "@/server/auth";
import { confirmationState } from "@/server/auth/queries";
import { safeCallbackUrl } from "@/server/auth/schemas";
import { ConfirmEmailForm } from "../forms";
import { AuthCard, first } from "../page-shell";

export const metadata: Metadata = { title: "Confirm your e-mail address", referrer: "no-referrer" };

const REFUSED = {
  used: "This link was already used, so your address is confirmed. Sign in to continue.",
  expired:
    "This link has expired (links work for 24 hours). Sign in with your e-mail and password, and we will offer to send a new one.",
  unknown: "This link is not valid: it may be incomplete, or an older one. Open the newest one we e-mailed you.",
} as const;

const primary =
  "inline-block rounded bg-accent px-4 py-2 font-semibold text-ink-950 no-underline hover:bg-accent-strong";

/**
 * Where the confirmation mail's link lands. Opening it changes nothing (mail scanners open links
 * too); the button does, signs the visitor in and comes back here with `confirmed`, which is
 * only believed for a signed-in visitor (every session belongs to a proven address).
 */
export default async function ConfirmEmailPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const params = await searchParams;
  const token = first(params.token) ?? "";
  const callbackUrl = safeCallbackUrl(first(params.callbackUrl));
  const user = first(params.confirmed) ? await auth() : null;
  if (user) {
    return (
      <AuthCard
        title="Your address is confirmed"
        lead={`You are signed in as ${user.name ? `${user.name} (${user.email})` : user.email}.`}
      >
        <p role="status" className="text-ink-200">
          Your account is ready.
        </p>
        <Link href={callbackUrl} className={primary}>
          Continue
        </Link>
      </AuthCard>
    );
  }
  const state = token && token.length <= 200 ? await confirmationState({ token }) : "unknown";
  const signIn = callbackUrl === "/" ? "/sign-in" : `/sign-in?callbackUrl=${encodeURIComponent(callbackUrl)}`;
  if (state !== "valid") {
    return (
      <AuthCard title={state === "used" ? "Already confirmed" : "This link no longer works"}>
        <p role="alert" className="text-ink-200">
          {REFUSED[state]}
        </p>
        <Link href={signIn} className={primary}>
          Sign in
        </Link>
      </AuthCard>
    );
  }
  return (
    <AuthCard
      title="Confirm your e-mail address"
      lead="One step left: confirm that this address is yours, and your account is ready."
    >
      <ConfirmEmailForm token={token} callbackUrl={callbackUrl} />
    </AuthCard>
  );
}
