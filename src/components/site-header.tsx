import Link from "next/link";
import { SignOutButton } from "./sign-out-button";

/** The top bar; the root layout reads the session and passes the signed-in user, or null. */
export function SiteHeader({ user }: { user: { email: string; name: string | null } | null }) {
  return (
    <header className="border-b border-ink-800 bg-ink-900/80">
      <nav
        aria-label="Main"
        className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3 sm:px-6"
      >
        <Link href="/" className="flex items-center gap-2 font-mono text-lg font-bold text-accent no-underline">
          <span aria-hidden className="inline-block h-3 w-3 rotate-45 bg-accent" />
          Framefork
        </Link>
        <Link href="/games" className="text-sm text-ink-200 hover:text-ink-100 hover:underline">
          Games
        </Link>
        {user && (
          <Link href="/teams" className="text-sm text-ink-200 hover:text-ink-100 hover:underline">
            Teams
          </Link>
        )}
        <Link href="/help" className="text-sm text-ink-200 hover:text-ink-100 hover:underline">
          Help
        </Link>
        <div className="ml-auto flex items-center gap-4 text-sm" data-testid="account-area">
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
      </nav>
    </header>
  );
}
