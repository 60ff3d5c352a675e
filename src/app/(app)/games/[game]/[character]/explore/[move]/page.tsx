import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { ExplorerPage, explorerTitle } from "@/app/_shared/explorer-page";
import { parseExplorerSearch } from "@/lib/explorer";
import { readerActions } from "@/lib/reader-teams";
import { atLeast } from "@/lib/roles";
import { decodeSegment } from "@/lib/segment";
import { auth } from "@/server/auth";
import { getRole } from "@/server/authz";
import { getExplorerData } from "@/server/db/queries/explorer";
import { listMyTeams } from "@/server/db/queries/teams";
import { loadCharacter } from "../../../../data";

type Props = PageProps<"/games/[game]/[character]/explore/[move]">;

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { game, character, move } = await params;
  const found = await loadCharacter(game, character);
  return explorerTitle(decodeSegment(move), found.character.name);
}

/**
 * The Explorer, rendered for each request: a team's game, a draft, or an
 * address the proxy does not send to the cached copy (src/server/published.ts).
 */
export default async function ExplorePage({ params, searchParams }: Props) {
  const slugs = await params;
  const root = decodeSegment(slugs.move);
  const { game, character } = await loadCharacter(slugs.game, slugs.character);
  const search = parseExplorerSearch(await searchParams);
  // An unknown Edition falls back to the newest, as the move list does.
  let found = await getExplorerData({ characterId: character.id, edition: search.edition });
  if (!found.ok && found.missing === "edition") found = await getExplorerData({ characterId: character.id });
  if (!found.ok) notFound();
  // Signed in: Share and Make a board, for the teams whose role allows them.
  const user = await auth();
  const role = user && game.teamId !== null ? await getRole({ teamId: game.teamId, userId: user.id }) : null;
  const myTeams = user ? await listMyTeams({ userId: user.id }) : null;

  return (
    <ExplorerPage
      data={found.data}
      root={root}
      live={{
        search,
        ...readerActions(myTeams),
        editor: atLeast(role, "coach") ? { game: game.slug, character: character.slug } : undefined,
      }}
    />
  );
}
