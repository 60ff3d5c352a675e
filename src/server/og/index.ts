import "server-only";
import { loadSharedView } from "@/server/db/queries/permalinks";
import { renderPermalinkImage } from "./permalink-image";
import { summarizeSharedView } from "./summary";

export { PERMALINK_IMAGE_SIZE, renderPermalinkImage } from "./permalink-image";
export { summarizeSharedView, type PermalinkImageSummary } from "./summary";

/**
 * The Open Graph image of `/s/[slug]` (for `opengraph-image.tsx`). Previews
 * are fetched by other services without anyone's session, so the link is
 * read as a signed-out visitor: team-only, revoked and unknown links all get
 * the generic card.
 */
export async function permalinkImageForSlug({ slug }: { slug: string }) {
  const shared = await loadSharedView({ slug, viewerId: null });
  return renderPermalinkImage(shared.status === "ok" ? summarizeSharedView(shared.view) : { kind: "private" });
}
