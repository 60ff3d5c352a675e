"use client";

import Link from "next/link";
import { signIn } from "next-auth/react";
import { useActionState, useState, useTransition } from "react";
import { changePassword, requestPasswordReset, resetPassword, signUp } from "./actions";
import { Field, fieldError, formError, NewPasswordField, Notice, Submit } from "./fields";

const MISMATCH = "That e-mail and password don't match.";

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
}: {
  label: string;
  submit: string;
  pendingText: string;
  send: (form: FormData) => Promise<string | null>;
  children: React.ReactNode;
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
      {children}
      <Submit pending={pending} pendingText={pendingText}>
        {submit}
      </Submit>
    </form>
  );
}

const text = (form: FormData, name: string) => String(form.get(name) ?? "");

export function PasswordSignInForm({ callbackUrl }: { callbackUrl: string }) {
  return (
    <NextAuthForm
      label="Sign in with password"
      submit="Sign in"
      pendingText="Signing in…"
      send={async (form) => {
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

export function SignUpForm({ callbackUrl, defaultEmail }: { callbackUrl: string; defaultEmail?: string }) {
  const [state, setState] = useState<Awaited<ReturnType<typeof signUp>>>(null);
  const [pending, start] = useTransition();
  return (
    <form
      aria-label="Create your account"
      className="space-y-4"
      onSubmit={(event) => {
        event.preventDefault();
        const form = new FormData(event.currentTarget);
        start(async () => {
          const answer = await signUp(null, form);
          setState(answer);
          if (!answer?.ok) return;
          const result = await signIn("credentials", {
            redirect: false,
            email: text(form, "email"),
            password: text(form, "password"),
            callbackUrl,
          });
          if (result?.ok && !result.error) go(callbackUrl);
          else go(`/sign-in?callbackUrl=${encodeURIComponent(callbackUrl)}`);
        });
      }}
    >
      <Notice error={formError(state)} message={state?.ok ? `${state.message} Signing you in…` : null} />
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
