"use client";

import { useId } from "react";
import type { ActionState } from "@/server/actions";

/** A labelled input with its error beside it (read by screen readers through aria-describedby). */
export function Field({
  name,
  label,
  type = "text",
  autoComplete,
  error,
  defaultValue,
  hint,
}: {
  name: string;
  label: string;
  type?: "text" | "email" | "password";
  autoComplete?: string;
  error?: string;
  defaultValue?: string;
  hint?: string;
}) {
  // Two forms on one page may both have an e-mail field: ids must still be unique.
  const id = `${useId()}-${name}`;
  const described = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(" ") || undefined;
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-medium text-ink-200">
        {label}
      </label>
      <input
        id={id}
        name={name}
        type={type}
        autoComplete={autoComplete}
        defaultValue={defaultValue}
        required
        aria-invalid={error ? true : undefined}
        aria-describedby={described}
        className="w-full rounded border border-ink-600 bg-ink-900 px-3 py-2 text-ink-100 placeholder:text-ink-400 aria-[invalid=true]:border-red-400"
      />
      {hint ? (
        <p id={`${id}-hint`} className="text-xs text-ink-400">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} className="text-sm text-red-300">
          {error}
        </p>
      ) : null}
    </div>
  );
}

export function NewPasswordField({ name, label, error }: { name: string; label: string; error?: string }) {
  return (
    <Field
      name={name}
      label={label}
      type="password"
      autoComplete="new-password"
      hint="10 to 200 characters. A few unrelated words make a good one."
      error={error}
    />
  );
}

export function Submit({
  pending,
  children,
  pendingText,
}: {
  pending: boolean;
  children: React.ReactNode;
  pendingText: string;
}) {
  return (
    <button
      type="submit"
      disabled={pending}
      aria-disabled={pending}
      className="w-full rounded bg-accent px-4 py-2 font-semibold text-ink-950 hover:bg-accent-strong disabled:cursor-wait disabled:opacity-70"
    >
      {pending ? pendingText : children}
    </button>
  );
}

/** The form's answer: an alert for an error, a status line for success. */
export function Notice({ error, message }: { error?: string | null; message?: string | null }) {
  if (error) {
    return (
      <p role="alert" className="rounded border border-red-400/50 bg-red-950/40 px-3 py-2 text-sm text-red-200">
        {error}
      </p>
    );
  }
  if (message) {
    return (
      <p role="status" className="rounded border border-block-plus/50 bg-ink-850 px-3 py-2 text-sm text-ink-100">
        {message}
      </p>
    );
  }
  return null;
}

export const fieldError = (state: ActionState, name: string): string | undefined =>
  state && !state.ok ? state.fieldErrors?.[name] : undefined;

export const formError = (state: ActionState): string | null =>
  state && !state.ok && !state.fieldErrors ? state.error : null;
