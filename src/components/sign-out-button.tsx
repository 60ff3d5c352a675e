"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { refreshSession } from "./session-refresh";

/**
 * Signs out through next-auth's own endpoint (CSRF token, then POST /api/auth/signout), the
 * same two requests `signOut()` from next-auth/react makes. Done by hand because this button is
 * in the header of every page, and next-auth's client would add its weight to each of them
 * (the Explorer's first load has a 300 KB budget).
 */
async function signOutNow() {
  const { csrfToken } = (await (await fetch("/api/auth/csrf")).json()) as { csrfToken: string };
  await fetch("/api/auth/signout", {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ csrfToken, callbackUrl: "/", json: "true" }),
  });
}

export function SignOutButton() {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [failed, setFailed] = useState(false);
  return (
    <button
      type="button"
      disabled={pending}
      onClick={() => {
        setPending(true);
        setFailed(false);
        signOutNow().then(
          () => {
            // The header and every server-rendered part read the session again.
            refreshSession();
            router.replace("/");
            router.refresh();
          },
          () => {
            setPending(false);
            setFailed(true);
          },
        );
      }}
      title={failed ? "Signing out did not work: check your connection and try again." : undefined}
      className="rounded px-2 py-1 text-ink-200 hover:bg-ink-800 hover:text-ink-100 disabled:opacity-70"
    >
      {pending ? "Signing out…" : failed ? "Sign out (try again)" : "Sign out"}
    </button>
  );
}
