import "server-only";
import { LRUCache } from "lru-cache";
import { graphSchema } from "@/lib/engine";
import type { GraphResponse } from "@/lib/explorer";
import { getExplorerData } from "./db/queries/explorer";
import { jsonBody, type JsonBody } from "./http-cache";
import type { PublicCharacter } from "./published";

/**
 * How long each kind of answer may be reused. Every 200 carries a strong ETag,
 * and a request naming it in If-None-Match gets a 304 without a body.
 * - A published Edition of a public game: the same for everyone, so shared
 *   caches may keep it (s-maxage says so apart, for the app's own shared
 *   cache, scripts/shared-cache.mjs, which keeps only what says it). Its rows never change, but the body lists the game's
 *   Editions, which grows when the next one is published: five minutes when
 *   the address names the Edition (the Explorer always does), then a day of
 *   serving the old copy while it is checked again; a minute for the newest.
 * - A published Edition of a team's game: only for its members, so never in a
 *   shared cache, and checked again on every use (a coach may start a draft,
 *   which the body lists; a member may leave the team). Vary: Cookie, since
 *   the session decides the answer.
 * - A draft: its coaches change it any time, so nothing keeps it anywhere.
 */
export const GRAPH_CACHE = {
  publicEdition: "public, max-age=300, s-maxage=300, stale-while-revalidate=86400",
  publicNewest: "public, max-age=60, s-maxage=60, stale-while-revalidate=600",
  teamPublished: "private, no-cache",
  draft: "private, no-store",
} as const;

/**
 * The graph API's answer for a published Edition of a public game is the same
 * bytes for everyone until the game's catalog changes, so it is serialised
 * once per process and kept. The key names the character, the Edition and
 * the catalog's signature: the body lists the game's Editions and its cast,
 * so a newly published Edition (or any change to the catalog) makes a new
 * key rather than a stale body, and nothing is ever invalidated. Bounded by
 * count and by the characters held, least recently used first out. A draft's
 * body and a team's game's are never kept.
 */
const bodies = new LRUCache<string, JsonBody>({
  max: 500,
  maxSize: 64_000_000,
  sizeCalculation: (b) => b.bytes.byteLength,
});

/** Cold requests for the same key share one read. */
const reading = new Map<string, Promise<JsonBody | null>>();

/** The graph API's body: stored data the engine would refuse is our fault (handle() answers 500). */
export function graphBody(data: GraphResponse): JsonBody {
  graphSchema.parse(data.graph);
  return jsonBody(data);
}

/**
 * The body for a public game's character in a published Edition (`edition`
 * by slug, default the newest), from memory when it was made before; null
 * when the Edition is unknown or a draft, which the caller answers live.
 */
export async function publishedGraphBody(
  { catalog, character }: PublicCharacter,
  edition: string | undefined,
): Promise<JsonBody | null> {
  const chosen = edition === undefined ? catalog.editions[0] : catalog.editions.find((e) => e.slug === edition);
  if (!chosen || chosen.status !== "published") return null;
  const key = `${character.id}:${chosen.id}:${catalog.signature}`;
  const kept = bodies.get(key);
  if (kept) return kept;
  let pending = reading.get(key);
  if (!pending) {
    pending = (async () => {
      const found = await getExplorerData({ characterId: character.id, edition: chosen.slug });
      if (!found.ok || found.data.edition.id !== chosen.id || found.data.edition.status !== "published") return null;
      const body = graphBody(found.data);
      bodies.set(key, body);
      return body;
    })().finally(() => reading.delete(key));
    reading.set(key, pending);
  }
  return pending;
}

/** Forgets every kept body (tests). */
export function forgetGraphBodies(): void {
  bodies.clear();
}
