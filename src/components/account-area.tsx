"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import useSWR from "swr";
import { SESSION_URL } from "./session-refresh";
import { SignOutButton } from "./sign-out-button";

interface SessionAnswer {
  user?: { email: string; name: string | null };
}

async function readSession(url: string): Promise<SessionAnswer> {
  const response = await fetch(url, { cache: "no-store" });
  if (!response.ok) throw new Error(`The session could not be read (${response.status}).`);
  return (await response.json()) as SessionAnswer;
}

/**
 * The header's account part, read in the browser: the root layout renders no
 * session, so a page of a published Edition is the same HTML for everyone and
 * can be served from the cache. The session is read again on each navigation
 * (a sign-in or sign-out ends in one), keeping the last answer on screen meanwhile.
 */
export function AccountArea() {
  const pathname = usePathname();
  const { data, error } = useSWR([SESSION_URL, pathname], ([url]) => readSession(url), {
    keepPreviousData: true,
  });

  if (!data) {
    return (
      <div className="ml-auto flex items-center gap-4 text-sm" data-testid="account-area" aria-busy={!error}>
        {error ? (
          <Link href="/sign-in" className="text-ink-200 hover:text-ink-100 hover:underline">
            Sign in
          </Link>
        ) : (
          <span className="h-5 w-24 animate-pulse rounded bg-ink-800" aria-label="Reading your session" />
        )}
      </div>
    );
  }

  const user = data.user;
  return (
    <div className="ml-auto flex items-center gap-4 text-sm" data-testid="account-area">
      {user && (
        <Link href="/teams" className="text-ink-200 hover:text-ink-100 hover:underline">
          Teams
        </Link>
      )}
      {user ? (
        <>
          <Link
            href="/account"
            className="max-w-[12rem] truncate text-ink-200 hover:text-ink-100 hover:underline"
            title={user.email}
          >
            {user.name ?? user.email}
          </Link>
          <SignOutButton />
        </>
      ) : (
        <>
          <Link href="/sign-in" className="text-ink-200 hover:text-ink-100 hover:underline">
            Sign in
          </Link>
          <Link
            href="/sign-up"
            className="rounded border border-accent-muted px-2 py-1 text-accent no-underline hover:bg-ink-800"
          >
            Sign up
          </Link>
        </>
      )}
    </div>
  );
}
