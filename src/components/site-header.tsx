import Link from "next/link";
import { AccountArea } from "./account-area";

/**
 * The top bar. It is the same for every visitor, so no page is made dynamic by
 * it; the account part reads the session in the browser.
 */
export function SiteHeader() {
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
        <Link href="/help" className="text-sm text-ink-200 hover:text-ink-100 hover:underline">
          Help
        </Link>
        <AccountArea />
      </nav>
    </header>
  );
}
