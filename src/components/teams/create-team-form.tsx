"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { AppError } from "@/lib/errors";
import { sendJson } from "@/lib/fetcher";

/** Starts a team: the creator becomes its first owner and lands on its page. */
export function CreateTeamForm() {
  const router = useRouter();
  const [name, setName] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const made = await sendJson<{ team: { slug: string } }>("POST", "/api/teams", { name });
      router.push(`/teams/${made!.team.slug}`);
    } catch (err) {
      setError(err instanceof AppError ? err.message : "The team could not be created. Try again.");
      setBusy(false);
    }
  };

  return (
    <form onSubmit={submit} className="space-y-2 rounded-lg border border-ink-800 p-4" aria-labelledby="new-team-title">
      <h2 id="new-team-title" className="text-sm font-medium text-ink-200">
        Start a team
      </h2>
      <div className="flex flex-wrap items-end gap-2">
        <label className="flex flex-col gap-1 text-sm">
          <span className="text-ink-400">Team name</span>
          <input
            value={name}
            onChange={(e) => setName(e.target.value)}
            required
            minLength={2}
            maxLength={120}
            className="w-64 rounded border border-ink-700 bg-ink-900 px-2 py-1 text-ink-100"
          />
        </label>
        <button
          type="submit"
          disabled={busy}
          className="rounded bg-accent px-3 py-1.5 text-sm font-medium text-ink-950 disabled:opacity-50"
        >
          {busy ? "Creating…" : "Create team"}
        </button>
      </div>
      {error && (
        <p role="alert" className="text-sm text-block-launch-punishable">
          {error}
        </p>
      )}
    </form>
  );
}
