import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { StancePage, stanceTitle } from "@/app/_shared/stance-page";
import { decodeSegment } from "@/lib/segment";
import { getStanceSheet } from "@/server/db/queries/stance-sheets";
import { loadPublished } from "@/server/published";

type Props = PageProps<"/published/[edition]/[catalog]/games/[game]/[character]/stances/[stance]">;

// Rendered on its first request and kept for ever: a published Edition never changes.
export const revalidate = false;
export function generateStaticParams() {
  return [];
}

async function load(props: Props) {
  const slugs = await props.params;
  const { character, edition } = await loadPublished(slugs.edition, slugs.game, slugs.character);
  const found = await getStanceSheet({
    characterId: character.id,
    edition: edition.slug,
    stanceKey: decodeSegment(slugs.stance),
  });
  if (!found.ok) notFound();
  return found.data;
}

export async function generateMetadata(props: Props): Promise<Metadata> {
  return stanceTitle(await load(props));
}

/** A stance sheet of a published Edition of a public game, as the proxy sends it here. */
export default async function PublishedStancePage(props: Props) {
  return <StancePage data={await load(props)} />;
}
