import Link from "next/link";
import { SWRConfig } from "swr";
import { ExplorerView } from "@/components/explorer/explorer-view";
import { ExplorerStoreProvider } from "@/components/providers/explorer-store-provider";
import { graphUrl } from "@/lib/explorer";
import { VISIBILITY_TEXT, viewToExplorerState } from "@/lib/permalink";
import type { SharedExplorerViewDto } from "@/lib/dto";
import { SignInHereLink } from "@/components/sign-in-here-link";

const dateFormat = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeZone: "UTC" });

/**
 * `/s/[slug]`: the Explorer read-only on the Edition the link is pinned to,
 * with the shared path selected. Seeded like the Explorer page (SWR fallback
 * and a store), but SWR never refetches: the pinned data is the view.
 */
export function SharedExplorer({ view: shared }: { view: SharedExplorerViewDto }) {
  const { data, view } = shared;
  const visibility = VISIBILITY_TEXT[shared.visibility];
  return (
    <div className="space-y-4">
      <header className="space-y-1">
        <p className="text-sm text-ink-400">
          Permalink · {data.game.name} · {data.character.name}
        </p>
        <h1 className="text-xl font-semibold">
          <span className="font-mono">{shared.title}</span>
        </h1>
        <p className="text-sm text-ink-300">
          Shared by {shared.creatorName ?? "a team member"} on{" "}
          <time dateTime={shared.createdAt}>{dateFormat.format(new Date(shared.createdAt))}</time> ·{" "}
          <span title={visibility.explain}>{visibility.label}</span> · read-only: clicking around does not change the
          link.
        </p>
      </header>
      <SWRConfig
        value={{
          fallback: {
            [graphUrl(shared.characterId, shared.edition.slug)]: data,
            ...(shared.opponent
              ? { [graphUrl(shared.opponent.character.id, shared.edition.slug)]: shared.opponent }
              : {}),
          },
          revalidateOnMount: false,
          revalidateIfStale: false,
          revalidateOnFocus: false,
          revalidateOnReconnect: false,
        }}
      >
        <ExplorerStoreProvider initial={viewToExplorerState(view, shared.edition.slug)}>
          <ExplorerView characterId={shared.characterId} root={view.root} pinned />
        </ExplorerStoreProvider>
      </SWRConfig>
    </div>
  );
}

/**
 * For a link that is unknown, revoked or not the viewer's to see: one page for all, so it tells
 * nothing. A signed-out visitor is offered to sign in, whatever the link is.
 */
export function SharedUnavailable({ signedOut }: { signedOut: boolean }) {
  return (
    <div className="mx-auto max-w-xl space-y-3 py-12 text-center">
      <h1 className="text-xl font-semibold">This link is not available</h1>
      <p className="text-ink-300">
        It may have been revoked, mistyped, or shared only with a team you are not in. Ask the person who sent it for a
        new one.
      </p>
      {signedOut && (
        <p className="text-ink-300">
          If it was shared with your team, <SignInHereLink>sign in</SignInHereLink> with the account you use in that
          team.
        </p>
      )}
      <Link href="/games" className="text-accent underline underline-offset-2">
        Browse the games
      </Link>
    </div>
  );
}
