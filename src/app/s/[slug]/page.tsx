import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { SharedBoard } from "@/components/boards/shared-board";
import { SharedExplorer } from "@/components/explorer/shared-explorer";
import { SharedStance } from "@/components/stances/shared-stance";
import { SAFE_ONLY_PARAM } from "@/lib/stance-sheet";
import { auth } from "@/server/auth";
import { loadSharedView } from "@/server/db/queries/permalinks";

type Props = PageProps<"/s/[slug]">;

// Rendered for each visit: a team-only link, a board's, a revoked or unknown one, or one with a
// query. A link anyone may open is sent to its cached copy by the proxy (src/server/published.ts).
export const dynamic = "force-dynamic";

async function load(slug: string) {
  const user = await auth();
  return loadSharedView({ slug, viewerId: user?.id ?? null });
}

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { slug } = await params;
  const shared = await load(slug);
  // Only a link anyone may open names what it shows; the rest leak nothing, not even a title.
  if (shared.status !== "ok" || shared.view.visibility !== "link")
    return { title: "Shared view", robots: { index: false } };
  return { title: shared.view.title, robots: { index: false } };
}

/** A shared Explorer view, Mix-up board or stance sheet, read-only and pinned to its Edition. */
export default async function SharedPage({ params, searchParams }: Props) {
  const { slug } = await params;
  const shared = await load(slug);
  if (shared.status === "unavailable") notFound();
  if (shared.view.kind === "board") return <SharedBoard view={shared.view} />;
  if (shared.view.kind === "stance")
    return <SharedStance view={shared.view} safeOnly={(await searchParams)[SAFE_ONLY_PARAM] === "1"} />;
  return <SharedExplorer view={shared.view} />;
}
