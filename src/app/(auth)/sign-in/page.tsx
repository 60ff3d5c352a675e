import type { Metadata } from "next";
import Link from "next/link";
import { PasswordSignInForm, SignInLinkForm } from "../forms";
import { AuthCard, callbackFor, first } from "../page-shell";

export const metadata: Metadata = { title: "Sign in" };

/** next-auth sends people back here with ?error= when a link fails; only its known codes are shown. */
const LINK_ERRORS: Record<string, string> = {
  Verification:
    "This sign-in link has expired or was already used. Enter your e-mail below and we will send a new one.",
  EmailSignin: "We could not send the sign-in e-mail. Try again in a moment.",
  SessionRequired: "Sign in to see that page.",
};

export default async function SignInPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { callbackUrl, withCallback, params } = await callbackFor(searchParams);
  const code = first(params.error);
  const linkError = code ? (LINK_ERRORS[code] ?? "Sign-in did not work. Try again.") : null;
  const signedOutEverywhere = first(params.signedOut) === "everywhere";
  return (
    <AuthCard
      title="Sign in"
      lead={
        <>
          New to Framefork?{" "}
          <Link href={`/sign-up${withCallback}`} className="text-accent underline underline-offset-2">
            Create an account
          </Link>
        </>
      }
    >
      {signedOutEverywhere ? (
        <p role="status" className="rounded border border-block-plus/50 bg-ink-850 px-3 py-2 text-sm text-ink-100">
          You are signed out on every device, this one too.
        </p>
      ) : null}
      {linkError ? (
        <p role="alert" className="rounded border border-red-400/50 bg-red-950/40 px-3 py-2 text-sm text-red-200">
          {linkError}
        </p>
      ) : null}
      <PasswordSignInForm callbackUrl={callbackUrl} />
      <div className="flex items-center gap-3 text-xs tracking-wide text-ink-400 uppercase" aria-hidden>
        <span className="h-px flex-1 bg-ink-700" />
        or
        <span className="h-px flex-1 bg-ink-700" />
      </div>
      <SignInLinkForm callbackUrl={callbackUrl} />
    </AuthCard>
  );
}
