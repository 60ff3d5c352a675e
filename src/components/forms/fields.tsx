"use client";

import type { ReactNode } from "react";
import type { FieldValues, Path, UseFormReturn, UseFormSetError } from "react-hook-form";
import { AppError } from "@/lib/errors";

export const control =
  "w-full min-w-0 rounded border border-ink-700 bg-ink-900 px-2 py-1 text-sm text-ink-100 aria-[invalid=true]:border-block-launch-punishable";
export const primaryButton =
  "rounded bg-accent px-3 py-1.5 text-sm font-medium text-ink-950 disabled:opacity-60 hover:bg-accent-strong";

/** A field's error as react-hook-form gives it: only its message is shown. */
type Shown = { message?: string };

/** A labelled field with its error in words beneath it, tied to the input for screen readers. */
export function Field({
  id,
  label,
  hint,
  error,
  children,
}: {
  id: string;
  label: string;
  hint?: string;
  error?: Shown;
  children: ReactNode;
}) {
  return (
    <div className="flex flex-col gap-1 text-sm">
      <label htmlFor={id} className="text-ink-400">
        {label}
      </label>
      {children}
      {hint && !error && (
        <span id={`${id}-hint`} className="text-xs text-ink-400">
          {hint}
        </span>
      )}
      {error?.message && (
        <span id={`${id}-error`} role="alert" className="text-xs text-ink-100">
          {error.message}
        </span>
      )}
    </div>
  );
}

/** The props that tie an input to its Field's hint and error. */
export function described(id: string, error?: Shown) {
  return {
    id,
    "aria-invalid": error ? true : undefined,
    "aria-describedby": error ? `${id}-error` : `${id}-hint`,
  } as const;
}

/**
 * Shows a refusal from the server where it belongs: each issue at its field (the routes check
 * with the same schemas as the form, so the paths match), anything else as the form's own error.
 */
export function showRefusal<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, fields: string[]) {
  const refusal = error instanceof AppError ? error : new AppError("internal", "That did not work. Try again.");
  let placed = false;
  for (const issue of refusal.issues ?? []) {
    const field = String(issue.path[0] ?? "");
    if (fields.includes(field)) {
      setError(field as Path<T>, { message: issue.message });
      placed = true;
    }
  }
  if (!placed) setError("root" as Path<T>, { message: refusal.message });
}

/** A text or number input registered with a form, inside its labelled Field. */
export function TextInput<T extends FieldValues>({
  form,
  name,
  id,
  label,
  hint,
  type = "text",
}: {
  form: UseFormReturn<T, unknown, FieldValues>;
  name: Path<T>;
  id: string;
  label: string;
  hint?: string;
  type?: "text" | "number" | "date";
}) {
  const error = form.formState.errors[name] as Shown | undefined;
  return (
    <Field id={id} label={label} hint={hint} error={error}>
      <input
        type={type}
        {...(type === "number" ? { inputMode: "numeric" as const } : {})}
        {...form.register(name)}
        {...described(id, error)}
        className={control}
      />
    </Field>
  );
}

/** A form's submit button, with its busy label and the form's own error beside it. */
export function FormEnd({
  busy,
  label,
  error,
  children,
}: {
  busy: boolean;
  label: string;
  error?: string;
  children?: ReactNode;
}) {
  return (
    <div className="flex flex-wrap items-center gap-3">
      <button type="submit" disabled={busy} className={primaryButton}>
        {busy ? "Saving…" : label}
      </button>
      {children}
      {error && (
        <p role="alert" className="text-sm text-ink-100">
          {error}
        </p>
      )}
    </div>
  );
}
