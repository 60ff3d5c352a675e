import type { Metadata } from "next";
import { MoveListPage } from "@/app/_shared/move-list-page";
import { getMoveList } from "@/server/db/queries/moves";
import { loadPublished } from "@/server/published";

type Props = PageProps<"/published/[edition]/[catalog]/games/[game]/[character]">;

// Rendered on its first request and kept for ever: a published Edition never changes.
export const revalidate = false;
export function generateStaticParams() {
  return [];
}

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { edition, game, character } = await params;
  const found = await loadPublished(edition, game, character);
  return { title: `${found.character.name} · ${found.game.name}` };
}

/** The move list of a published Edition of a public game, as the proxy sends it here. */
export default async function PublishedMoveListPage({ params }: Props) {
  const slugs = await params;
  const { game, character, editions, edition } = await loadPublished(slugs.edition, slugs.game, slugs.character);
  const list = await getMoveList({ characterId: character.id, editionId: edition.id });
  return (
    <MoveListPage
      game={game}
      character={character}
      editions={editions}
      edition={edition}
      list={list}
      edits={false}
      cached
    />
  );
}
