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
 * never kept: they all show the generic card.
 */
const summaries = new LRUCache<string, Promise<PermalinkImageSummary>>({ max: 5_000 });

/** Rendered previews by what they show, so equal summaries are drawn once. Bounded by bytes. */
const images = new LRUCache<string, { png: ArrayBuffer; headers: [string, string][] }>({
  max: 2_000,
  maxSize: 64_000_000,
  sizeCalculation: (image) => image.png.byteLength,
});
const drawing = new Map<string, Promise<{ png: ArrayBuffer; headers: [string, string][] }>>();

/**
 * The Open Graph image of `/s/[slug]` (for `opengraph-image.tsx`). Previews
 * are fetched by other services without anyone's session, so the link is
 * read as a signed-out visitor: team-only, revoked and unknown links all get
 * the generic card. Whether the link may still be opened is asked on every
 * request (`isCacheableLink`); the summary and the PNG are made once per
 * process.
 */
export async function permalinkImageForSlug({ slug }: { slug: string }): Promise<Response> {
  const summary = (await isCacheableLink(slug)) ? await linkSummary(slug) : PRIVATE;
  const { png, headers } = await imageOf(summary);
  return new Response(png, { headers });
}

function linkSummary(slug: string): Promise<PermalinkImageSummary> {
  let summary = summaries.get(slug);
  if (!summary) {
    summary = loadSharedView({ slug, viewerId: null }).then((shared) =>
      shared.status === "ok" ? summarizeSharedView(shared.view) : PRIVATE,
    );
    summaries.set(slug, summary);
    summary.catch(() => summaries.delete(slug));
  }
  return summary;
}

async function imageOf(summary: PermalinkImageSummary) {
  const key = JSON.stringify(summary);
  const kept = images.get(key);
  if (kept) return kept;
  let pending = drawing.get(key);
  if (!pending) {
    pending = renderPermalinkImage(summary)
      .then(async (response) => {
        const image = { png: await response.arrayBuffer(), headers: [...response.headers.entries()] };
        images.set(key, image);
        return image;
      })
      .finally(() => drawing.delete(key));
    drawing.set(key, pending);
  }
  return pending;
}
