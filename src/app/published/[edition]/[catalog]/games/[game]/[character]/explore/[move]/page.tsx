import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { ExplorerPage, explorerTitle } from "@/app/_shared/explorer-page";
import { decodeSegment } from "@/lib/segment";
import { getExplorerData } from "@/server/db/queries/explorer";
import { loadPublished } from "@/server/published";

type Props = PageProps<"/published/[edition]/[catalog]/games/[game]/[character]/explore/[move]">;

// Rendered on its first request and kept for ever: a published Edition never changes.
export const revalidate = false;
export function generateStaticParams() {
  return [];
}

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { edition, game, character, move } = await params;
  const found = await loadPublished(edition, game, character);
  return explorerTitle(decodeSegment(move), found.character.name);
}

/** The Explorer of a published Edition of a public game, as the proxy sends it here. */
export default async function PublishedExplorePage({ params }: Props) {
  const slugs = await params;
  const { character, edition } = await loadPublished(slugs.edition, slugs.game, slugs.character);
  const found = await getExplorerData({ characterId: character.id, edition: edition.slug });
  if (!found.ok) notFound();
  return <ExplorerPage data={found.data} root={decodeSegment(slugs.move)} />;
}
