import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { SWRConfig } from "swr";
import { ExplorerView } from "@/components/explorer/explorer-view";
import { ExplorerStoreProvider } from "@/components/providers/explorer-store-provider";
import { graphUrl, parseExplorerSearch, type GraphResponse } from "@/lib/explorer";
import { listEditions } from "@/server/db/queries/games";
import { getCharacterGraph } from "@/server/db/queries/moves";
import { loadCharacter } from "../../../../data";

type Props = PageProps<"/games/[game]/[character]/explore/[move]">;

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { game, character, move } = await params;
  const found = await loadCharacter(game, character);
  return { title: `${decodeURIComponent(move)} · ${found.character.name} Explorer` };
}

/** The Explorer: one string (or stance move) of a character drawn as a graph, with the Path card beside it. */
export default async function ExplorePage({ params, searchParams }: Props) {
  const slugs = await params;
  const root = decodeURIComponent(slugs.move);
  const { game, character } = await loadCharacter(slugs.game, slugs.character);
  const search = parseExplorerSearch(await searchParams);
  const editions = await listEditions({ gameId: game.id });
  const edition = editions.find((e) => e.slug === search.edition) ?? editions[0];
  if (!edition) notFound();

  // A move missing from this Edition is explained by the view, with a way back.
  const { graph, roots } = await getCharacterGraph({ characterId: character.id, editionId: edition.id });

  const fallback: GraphResponse = {
    game: { slug: game.slug, name: game.name, fps: game.fps, fastest: game.fastest, launchAt: game.launchAt },
    character: { id: character.id, slug: character.slug, name: character.name },
    edition,
    editions,
    roots,
    graph,
  };
  const rootMove = graph.nodes.find((n) => n.id === root);

  return (
    <div className="space-y-4">
      <nav aria-label="Breadcrumb" className="flex flex-wrap gap-2 text-sm text-ink-400">
        <Link href="/games" className="hover:underline">
          Games
        </Link>
        <span aria-hidden>/</span>
        <Link href={`/games/${game.slug}`} className="hover:underline">
          {game.name}
        </Link>
        <span aria-hidden>/</span>
        <Link href={`/games/${game.slug}/${character.slug}?edition=${edition.slug}`} className="hover:underline">
          {character.name}
        </Link>
      </nav>
      <h1 className="text-xl font-semibold">
        Explorer · <span className="font-mono">{root}</span>
        {rootMove?.kind === "move" && rootMove.name && <span className="ml-2 text-base font-normal text-ink-300">{rootMove.name}</span>}
      </h1>
      <SWRConfig value={{ fallback: { [graphUrl(character.id, edition.slug)]: fallback } }}>
        <ExplorerStoreProvider
          initial={{
            selected: search.path ?? null,
            options: {
              maxDepth: search.depth ?? 8,
              maxStanceVisits: search.visits ?? 1,
              fastest: search.fastest ?? game.fastest,
            },
          }}
        >
          <ExplorerView characterId={character.id} root={root} edition={edition.slug} />
        </ExplorerStoreProvider>
      </SWRConfig>
    </div>
  );
}
