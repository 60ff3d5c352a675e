import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { cache } from "react";
import { SharedExplorer } from "@/components/explorer/shared-explorer";
import { SharedStance } from "@/components/stances/shared-stance";
import { loadSharedView } from "@/server/db/queries/permalinks";
import { alt, contentType, size } from "@/app/s/[slug]/opengraph-image";

type Props = PageProps<"/published/links/[slug]">;

// Rendered on its first request and kept for ever: the link is pinned to a published Edition.
// The proxy sends a visit here only while the link is open to anyone (src/server/published.ts).
export const revalidate = false;
export function generateStaticParams() {
  return [];
}

/** The link as anyone sees it; only links anyone may open, and not a board's, are cached. */
const load = cache(async (slug: string) => {
  const shared = await loadSharedView({ slug, viewerId: null });
  if (shared.status !== "ok" || shared.view.visibility !== "link" || shared.view.kind === "board") notFound();
  return shared.view;
});

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { slug } = await params;
  const view = await load(slug);
  // The live route's preview image (src/app/s/[slug]/opengraph-image.tsx), named as that file names it there.
  const image = { url: `/s/${slug}/opengraph-image`, type: contentType, alt, ...size };
  return { title: view.title, robots: { index: false }, openGraph: { images: [image] } };
}

/** A shared Explorer view or stance sheet that anyone may open, as the proxy sends it here. */
export default async function PublishedLinkPage({ params }: Props) {
  const view = await load((await params).slug);
  if (view.kind === "stance") return <SharedStance view={view} safeOnly={false} />;
  return <SharedExplorer view={view} />;
}
