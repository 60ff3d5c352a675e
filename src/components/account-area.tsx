"use client";

import Link from "next/link";
import { useSession } from "./session";
import { SignOutButton } from "./sign-out-button";

/**
 * The header's account part, read in the browser: the root layout renders no
 * session, so a page of a published Edition is the same HTML for everyone and
 * can be served from the cache.
 */
export function AccountArea() {
  const { data, error } = useSession();

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
