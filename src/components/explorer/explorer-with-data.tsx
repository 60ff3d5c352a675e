"use client";

import { useSearchParams } from "next/navigation";
import { SWRConfig } from "swr";
import { ExplorerStoreProvider } from "@/components/providers/explorer-store-provider";
import { useMyTeams } from "@/components/session";
import { readerActions } from "@/lib/reader-teams";
import { graphUrl, parseExplorerSearch, type ExplorerSearch, type GraphResponse } from "@/lib/explorer";
import { ExplorerView, type ExplorerViewProps } from "./explorer-view";

interface ExplorerWithDataProps extends Omit<ExplorerViewProps, "characterId" | "pinned"> {
  /** The graph as the page was rendered with; SWR starts from it instead of asking again. */
  data: GraphResponse;
  /** The view the address asks for (path, opponent, options). */
  search: ExplorerSearch;
}

/** The Explorer over data the page already holds, in the view its address names. */
export function ExplorerWithData({ data, search, ...view }: ExplorerWithDataProps) {
  const { character, edition, cast, game } = data;
  return (
    <SWRConfig value={{ fallback: { [graphUrl(character.id, edition.slug)]: data } }}>
      <ExplorerStoreProvider
        initial={{
          edition: edition.slug,
          selected: search.path ?? null,
          opponent: search.vs !== undefined && cast.some((c) => c.id === search.vs) ? search.vs : null,
          options: {
            maxDepth: search.depth ?? 8,
            maxStanceVisits: search.visits ?? 1,
            fastest: search.fastest ?? game.fastest,
          },
        }}
      >
        <ExplorerView characterId={character.id} {...view} />
      </ExplorerStoreProvider>
    </SWRConfig>
  );
}

/**
 * The Explorer of a page served from the cache: the view comes from the
 * address and the Share and board buttons from the reader's teams, both read
 * in the browser, since the cached HTML is the same for everyone.
 */
export function ExplorerFromAddress({ data, root }: { data: GraphResponse; root: string }) {
  const params = useSearchParams();
  const teams = useMyTeams();
  const search = parseExplorerSearch(
    Object.fromEntries([...new Set(params.keys())].map((k) => [k, params.get(k) ?? undefined])),
  );
  return <ExplorerWithData data={data} search={search} root={root} {...readerActions(teams)} />;
}
