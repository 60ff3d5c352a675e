import "server-only";
import { LRUCache } from "lru-cache";
import { isCacheableLink, loadSharedView } from "@/server/db/queries/permalinks";
import { renderPermalinkImage } from "./permalink-image";
import { summarizeSharedView, type PermalinkImageSummary } from "./summary";

export { PERMALINK_IMAGE_SIZE, renderPermalinkImage } from "./permalink-image";
export { summarizeSharedView, type PermalinkImageSummary } from "./summary";

const PRIVATE: PermalinkImageSummary = { kind: "private" };

/**
 * What the preview of a link anyone may open shows, by slug: such a link is
 * pinned to a published Edition and never edited, so its summary never
 * changes. Links that are not (team-only, revoked, a board's, unknown) are
 * never kept: they all show the generic card. Reads in flight are shared.
 */
const summaries = new LRUCache<string, PermalinkImageSummary>({
  max: 5_000,
  fetchMethod: async (slug) => {
    const shared = await loadSharedView({ slug, viewerId: null });
    return shared.status === "ok" ? summarizeSharedView(shared.view) : PRIVATE;
  },
});

interface Image {
  png: ArrayBuffer;
  headers: [string, string][];
}

/** Rendered previews by what they show (the summary as JSON), drawn once each. Bounded by bytes. */
const images = new LRUCache<string, Image, { summary: PermalinkImageSummary }>({
  max: 2_000,
  maxSize: 64_000_000,
  sizeCalculation: (image) => image.png.byteLength,
  fetchMethod: async (_key, _stale, { context: { summary } }) => {
    const response = await renderPermalinkImage(summary);
    return { png: await response.arrayBuffer(), headers: [...response.headers.entries()] };
  },
});

/**
 * The Open Graph image of `/s/[slug]` (for `opengraph-image.tsx`). Previews
 * are fetched by other services without anyone's session, so the link is
 * read as a signed-out visitor: team-only, revoked and unknown links all get
 * the generic card. Whether the link may still be opened is asked for every
 * request (`isCacheableLink`, which reads it at most once a second); the
 * summary and the PNG are made once per process.
 */
export async function permalinkImageForSlug({ slug }: { slug: string }): Promise<Response> {
  const summary = ((await isCacheableLink(slug)) && (await summaries.fetch(slug))) || PRIVATE;
  const image = await images.fetch(JSON.stringify(summary), { context: { summary } });
  if (!image) throw new Error(`the preview of ${slug} was not drawn`);
  return new Response(image.png, { headers: image.headers });
}
