"use client";

import Link from "next/link";
import { signIn } from "next-auth/react";
import { useActionState, useState, useTransition } from "react";
import { MISMATCH, UNCONFIRMED } from "@/lib/auth-messages";
import type { ActionState } from "@/server/actions";
import {
  changePassword,
  confirmEmail,
  requestPasswordReset,
  resendConfirmation,
  resetPassword,
  signOutEverywhere,
  signUp,
} from "./actions";
import { Field, fieldError, formError, NewPasswordField, Notice, Submit } from "./fields";

/** next-auth's own codes for a failed password sign-in become our sentence; our messages pass through. */
function signInMessage(error: string | null | undefined): string {
  if (!error || error === "CredentialsSignin") return MISMATCH;
  if (/^[A-Za-z]+$/.test(error)) return "Sign-in did not work. Try again in a moment.";
  return error;
}

const go = (url: string) => window.location.assign(url);

/** A form whose submit calls next-auth's client; `send` answers an error sentence, or null once it has moved on. */
function NextAuthForm({
  label,
  submit,
  pendingText,
  send,
  children,
  besideError,
}: {
  label: string;
  submit: string;
  pendingText: string;
  send: (form: FormData) => Promise<string | null>;
  children: React.ReactNode;
  /** What to offer under a given error (a way out of it), if anything. */
  besideError?: (error: string) => React.ReactNode;
}) {
  const [error, setError] = useState<string | null>(null);
  const [pending, start] = useTransition();
  return (
    <form
      aria-label={label}
      className="space-y-4"
      onSubmit={(event) => {
        event.preventDefault();
        const form = new FormData(event.currentTarget);
        start(async () => {
          setError(null);
          setError(await send(form));
        });
      }}
    >
      <Notice error={error} />
      {error && besideError ? besideError(error) : null}
      {children}
      <Submit pending={pending} pendingText={pendingText}>
        {submit}
      </Submit>
    </form>
  );
}

const text = (form: FormData, name: string) => String(form.get(name) ?? "");

export function PasswordSignInForm({ callbackUrl }: { callbackUrl: string }) {
  // The address typed when the server said it is not confirmed yet: where a new link would go.
  const [email, setEmail] = useState("");
  return (
    <NextAuthForm
      label="Sign in with password"
      submit="Sign in"
      pendingText="Signing in…"
      besideError={(error) =>
        error === UNCONFIRMED ? <ResendConfirmation email={email} callbackUrl={callbackUrl} /> : null
      }
      send={async (form) => {
        setEmail(text(form, "email"));
        const result = await signIn("credentials", {
          redirect: false,
          email: text(form, "email"),
          password: text(form, "password"),
          callbackUrl,
        });
        if (result?.ok && !result.error) {
          go(callbackUrl);
          return null;
        }
        return signInMessage(result?.error);
      }}
    >
      <Field name="email" label="E-mail" type="email" autoComplete="email" />
      <Field name="password" label="Password" type="password" autoComplete="current-password" />
      <p className="text-sm">
        <Link href="/forgot-password" className="text-accent underline underline-offset-2">
          Forgot your password?
        </Link>
      </p>
    </NextAuthForm>
  );
}

export function SignInLinkForm({ callbackUrl }: { callbackUrl: string }) {
  return (
    <NextAuthForm
      label="E-mail me a sign-in link"
      submit="E-mail me a sign-in link"
      pendingText="Sending…"
      send={async (form) => {
        const result = await signIn("email", { redirect: false, email: text(form, "email"), callbackUrl });
        if (result?.ok && !result.error) {
          go("/check-email?for=link");
          return null;
        }
        return result?.error === "EmailSignin"
          ? "We could not send the e-mail. Try again in a moment."
          : signInMessage(result?.error);
      }}
    >
      <Field name="email" label="E-mail" type="email" autoComplete="email" />
    </NextAuthForm>
  );
}

/** A button inside the sign-in form (forms do not nest) that asks for a new confirmation link. */
function ResendConfirmation({ email, callbackUrl }: { email: string; callbackUrl: string }) {
  const [state, setState] = useState<ActionState>(null);
  const [pending, start] = useTransition();
  if (state?.ok) return <Notice message={state.message} />;
  return (
    <div className="space-y-2">
      {state ? <Notice error={state.error} /> : null}
      <button
        type="button"
        disabled={pending}
        onClick={() =>
          start(async () => {
            const form = new FormData();
            form.set("email", email);
            form.set("callbackUrl", callbackUrl);
            setState(await resendConfirmation(null, form));
          })
        }
        className="rounded border border-accent-muted px-3 py-1.5 text-sm text-accent hover:bg-ink-800 disabled:cursor-wait disabled:opacity-70"
      >
        {pending ? "Sending…" : "E-mail me a new confirmation link"}
      </button>
    </div>
  );
}

export function SignUpForm({ callbackUrl, defaultEmail }: { callbackUrl: string; defaultEmail?: string }) {
  // On success the action moves on to "check your e-mail"; only errors come back here.
  const [state, action, pending] = useActionState(signUp, null);
  return (
    <form action={action} aria-label="Create your account" className="space-y-4">
      <Notice error={formError(state)} />
      <input type="hidden" name="callbackUrl" value={callbackUrl} />
      <Field name="name" label="Name" autoComplete="name" error={fieldError(state, "name")} />
      <Field
        name="email"
        label="E-mail"
        type="email"
        autoComplete="email"
        defaultValue={defaultEmail}
        error={fieldError(state, "email")}
      />
      <NewPasswordField name="password" label="Password" error={fieldError(state, "password")} />
      <Submit pending={pending} pendingText="Creating your account…">
        Create account
      </Submit>
    </form>
  );
}

/** The confirm page's one button; on success the action moves on to the page saying so. */
export function ConfirmEmailForm({ token, callbackUrl }: { token: string; callbackUrl: string }) {
  const [state, action, pending] = useActionState(confirmEmail, null);
  const error = formError(state) ?? fieldError(state, "token") ?? null;
  return (
    <form action={action} aria-label="Confirm your e-mail address" className="space-y-4">
      <Notice error={error} />
      {error ? (
        <Link href="/sign-in" className="inline-block text-accent underline underline-offset-2">
          Go to sign in
        </Link>
      ) : null}
      <input type="hidden" name="token" value={token} />
      <input type="hidden" name="callbackUrl" value={callbackUrl} />
      <Submit pending={pending} pendingText="Confirming…">
        Confirm my address
      </Submit>
    </form>
  );
}

export function ForgotPasswordForm({ defaultEmail }: { defaultEmail?: string }) {
  const [state, action, pending] = useActionState(requestPasswordReset, null);
  return (
    <form action={action} aria-label="Reset your password" className="space-y-4">
      <Notice error={formError(state)} />
      <Field
        name="email"
        label="E-mail"
        type="email"
        autoComplete="email"
        defaultValue={defaultEmail}
        error={fieldError(state, "email")}
      />
      <Submit pending={pending} pendingText="Sending…">
        E-mail me a reset link
      </Submit>
    </form>
  );
}

export function ResetPasswordForm({ token }: { token: string }) {
  const [state, action, pending] = useActionState(resetPassword, null);
  if (state?.ok) {
    return (
      <div className="space-y-4">
        <Notice message={state.message} />
        <Link href="/sign-in" className="inline-block text-accent underline underline-offset-2">
          Sign in
        </Link>
      </div>
    );
  }
  const error = formError(state);
  return (
    <form action={action} aria-label="Choose a new password" className="space-y-4">
      <Notice error={error} />
      {error && state && !state.ok && (state.code === "conflict" || state.code === "not_found") ? (
        <Link href="/forgot-password" className="inline-block text-accent underline underline-offset-2">
          Send me a new link
        </Link>
      ) : null}
      <input type="hidden" name="token" value={token} />
      <NewPasswordField
        name="password"
        label="New password"
        error={fieldError(state, "password") ?? fieldError(state, "token")}
      />
      <Submit pending={pending} pendingText="Saving…">
        Save the new password
      </Submit>
    </form>
  );
}

export function ChangePasswordForm() {
  const [state, action, pending] = useActionState(changePassword, null);
  return (
    <form action={action} aria-label="Change your password" className="space-y-4">
      <Notice error={formError(state)} message={state?.ok ? state.message : null} />
      <Field
        name="currentPassword"
        label="Current password"
        type="password"
        autoComplete="current-password"
        error={fieldError(state, "currentPassword")}
      />
      <NewPasswordField name="newPassword" label="New password" error={fieldError(state, "newPassword")} />
      <Submit pending={pending} pendingText="Saving…">
        Change password
      </Submit>
    </form>
  );
}

/** Ends every session of the account, this one too; the action then moves on to the sign-in page. */
export function SignOutEverywhereForm() {
  const [state, action, pending] = useActionState(signOutEverywhere, null);
  return (
    <form action={action} aria-label="Sign out everywhere" className="space-y-4">
      <Notice error={formError(state)} />
      <Submit pending={pending} pendingText="Signing out…">
        Sign out everywhere
      </Submit>
    </form>
  );
}
