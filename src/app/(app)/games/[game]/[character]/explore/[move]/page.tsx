import type { Metadata } from "next";
import { Breadcrumb } from "@/components/ui/breadcrumb";
import { notFound } from "next/navigation";
import { SWRConfig } from "swr";
import { ExplorerView } from "@/components/explorer/explorer-view";
import { ExplorerStoreProvider } from "@/components/providers/explorer-store-provider";
import { graphUrl, parseExplorerSearch } from "@/lib/explorer";
import { atLeast } from "@/lib/roles";
import { auth } from "@/server/auth";
import { getRole } from "@/server/authz";
import { getExplorerData } from "@/server/db/queries/explorer";
import { listMyTeams } from "@/server/db/queries/teams";
import { loadCharacter } from "../../../../data";
import { decodeSegment } from "@/lib/segment";

type Props = PageProps<"/games/[game]/[character]/explore/[move]">;

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { game, character, move } = await params;
  const found = await loadCharacter(game, character);
  return { title: `${decodeSegment(move)} · ${found.character.name} Explorer` };
}

/** The Explorer: one string (or stance move) of a character drawn as a graph, with the Path card beside it. */
export default async function ExplorePage({ params, searchParams }: Props) {
  const slugs = await params;
  const root = decodeSegment(slugs.move);
  const { game, character } = await loadCharacter(slugs.game, slugs.character);
  const search = parseExplorerSearch(await searchParams);
  // An unknown Edition falls back to the newest, as the move list does.
  let found = await getExplorerData({ characterId: character.id, edition: search.edition });
  if (!found.ok && found.missing === "edition") found = await getExplorerData({ characterId: character.id });
  if (!found.ok) notFound();
  const fallback = found.data;
  const { graph, edition } = fallback;
  const rootMove = graph.nodes.find((n) => n.id === root);
  // Signed in: a Share button, offering the teams where the user may make permalinks (player or higher).
  const user = await auth();
  const role = user && game.teamId !== null ? await getRole({ teamId: game.teamId, userId: user.id }) : null;
  const myTeams = user ? await listMyTeams({ userId: user.id }) : null;
  const shareTeams = myTeams?.filter((t) => atLeast(t.role, "player")).map((t) => ({ id: t.id, name: t.name }));
  // Mix-up boards are made by coaches and owners, in their teams.
  const boardTeams = myTeams?.filter((t) => atLeast(t.role, "coach")).map((t) => ({ slug: t.slug, name: t.name }));

  return (
    <div className="space-y-4">
      <Breadcrumb
        trail={[
          { href: "/games", label: "Games" },
          { href: `/games/${game.slug}`, label: game.name },
          { href: `/games/${game.slug}/${character.slug}?edition=${edition.slug}`, label: character.name },
        ]}
      />
      <h1 className="text-xl font-semibold">
        Explorer · <span className="font-mono">{root}</span>
        {rootMove?.kind === "move" && rootMove.name && (
          <span className="ml-2 text-base font-normal text-ink-300">{rootMove.name}</span>
        )}
      </h1>
      <SWRConfig value={{ fallback: { [graphUrl(character.id, edition.slug)]: fallback } }}>
        <ExplorerStoreProvider
          initial={{
            edition: edition.slug,
            selected: search.path ?? null,
            opponent: search.vs !== undefined && fallback.cast.some((c) => c.id === search.vs) ? search.vs : null,
            options: {
              maxDepth: search.depth ?? 8,
              maxStanceVisits: search.visits ?? 1,
              fastest: search.fastest ?? game.fastest,
            },
          }}
        >
          <ExplorerView
            characterId={character.id}
            root={root}
            share={shareTeams ? { teams: shareTeams } : undefined}
            editor={atLeast(role, "coach") ? { game: game.slug, character: character.slug } : undefined}
            boards={boardTeams ? { teams: boardTeams } : undefined}
          />
        </ExplorerStoreProvider>
      </SWRConfig>
    </div>
  );
}
