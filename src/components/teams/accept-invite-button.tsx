"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { AppError } from "@/lib/errors";
import { sendJson } from "@/lib/fetcher";

export function AcceptInviteButton({ token }: { token: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const accept = async () => {
    setBusy(true);
    setError(null);
    try {
      const joined = await sendJson<{ team: { teamSlug: string } }>("POST", "/api/invites/accept", { token });
      router.push(`/teams/${joined!.team.teamSlug}`);
    } catch (err) {
      setError(err instanceof AppError ? err.message : "The invite could not be accepted. Try again.");
      setBusy(false);
    }
  };
  return (
    <div className="space-y-2">
      <button
        type="button"
        onClick={() => void accept()}
        disabled={busy}
        className="rounded bg-accent px-3 py-1.5 text-sm font-medium text-ink-950 disabled:opacity-50"
      >
        {busy ? "Joining…" : "Accept and join"}
      </button>
      {error && (
        <p role="alert" className="text-sm text-block-launch-punishable">
          {error}
        </p>
      )}
    </div>
  );
}
