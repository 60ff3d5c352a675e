import "server-only";
import { createHash } from "node:crypto";
import { LRUCache } from "lru-cache";
import { notFound } from "next/navigation";
import { cache } from "react";
import { readEditionKeys } from "./db/queries/moves";
import { isCacheableLink } from "./db/queries/permalinks";
import {
  getGameBySlug,
  listCharacters,
  listEditions,
  type CharacterSummary,
  type EditionSummary,
  type GameSummary,
} from "./db/queries/games";

/**
 * The pages of a published Edition of a public game are the same for every
 * reader and never change, so they are rendered once and served from Next's
 * cache (the routes under src/app/published, static with on-demand
 * generation). The proxy sends a public address there (`publishedAddress`)
 * when what it shows is published; anything else (a team's game, a draft, an
 * unknown Edition or character) goes to the live routes, which render for each
 * request and check who is reading.
 *
 * The cached address names the Edition's id and a signature of the game's
 * catalog (the game, its Editions, its characters): a page lists the game's
 * Editions, so a newly published one makes new addresses rather than stale
 * pages, and nothing is ever invalidated. It works the same with any number of
 * app servers, each filling its own cache.
 *
 * A Permalink that anyone may open (not a board's) is cached the same way by
 * its slug: it is pinned to a published Edition. Whether it may still be
 * opened (revoked, team-only) is asked on every visit, before the cache.
 */
export const PUBLISHED_PREFIX = "/published";

/** Where the cached copies of Permalinks live: by slug, as a link never changes. */
const LINKS_PREFIX = `${PUBLISHED_PREFIX}/links`;

/** The slug of a Permalink page's address ("/s/{slug}"), or null for any other address. */
function linkSlug(pathname: string): string | null {
  const parts = pathname.split("/");
  return parts.length === 3 && parts[1] === "s" && parts[2] ? parts[2] : null;
}

/** How long a public game's catalog is reused before it is read again. */
export const CATALOG_SECONDS = 5;

export interface PublicCatalog {
  game: GameSummary;
  editions: EditionSummary[];
  characters: CharacterSummary[];
  signature: string;
}

const catalogs = new Map<string, { until: number; catalog: Promise<PublicCatalog | "team" | null> }>();

/** A public game's catalog; "team" for a team's game; null for no game by that slug. */
async function readCatalog(gameSlug: string): Promise<PublicCatalog | "team" | null> {
  const game = await getGameBySlug({ slug: gameSlug });
  if (!game) return null;
  if (game.teamId !== null) return "team";
  const [editions, characters] = await Promise.all([
    listEditions({ gameId: game.id }),
    listCharacters({ gameId: game.id }),
  ]);
  const signature = createHash("sha256")
    .update(JSON.stringify({ game, editions, characters }))
    .digest("base64url")
    .slice(0, 16);
  return { game, editions, characters, signature };
}

/**
 * A public game's catalog, read at most once per CATALOG_SECONDS per process;
 * null for a team's game or an unknown slug. Only games that exist are kept,
 * so addresses made up by a stranger do not grow the map.
 */
async function publicCatalog(gameSlug: string): Promise<PublicCatalog | null> {
  const now = Date.now();
  let kept = catalogs.get(gameSlug);
  if (!kept || kept.until <= now) {
    kept = { until: now + CATALOG_SECONDS * 1000, catalog: readCatalog(gameSlug) };
    catalogs.set(gameSlug, kept);
  }
  const found = await kept.catalog.catch((error: unknown) => {
    catalogs.delete(gameSlug);
    throw error;
  });
  if (found === null) catalogs.delete(gameSlug);
  return found === "team" ? null : found;
}

/** Forgets what this process knows of public games' catalogs (tests). */
export function forgetCatalogs(): void {
  catalogs.clear();
}

function decoded(segment: string): string | null {
  try {
    return decodeURIComponent(segment);
  } catch {
    return null;
  }
}

/**
 * The keys of a published Edition's moves and stances for one character, read
 * once: a published Edition never changes. Only asked for public games, so the
 * map holds no more than their published Editions' characters.
 */
const indexes = new Map<string, Promise<{ moves: Set<string>; stances: Set<string> }>>();

function editionIndex(editionId: number, characterId: number) {
  const key = `${editionId}:${characterId}`;
  let index = indexes.get(key);
  if (!index) {
    index = readEditionKeys({ editionId, characterId }).then(({ moves, stances }) => ({
      moves: new Set(moves),
      stances: new Set(stances),
    }));
    index.catch(() => indexes.delete(key));
    indexes.set(key, index);
  }
  return index;
}

/**
 * The pages a public address may name, as path segments after "/games":
 * a move list ({game}/{character}), a stance sheet ({…}/stances/{stance}) and
 * the Explorer ({…}/explore/{move}).
 */
interface PublicPage {
  gameSlug: string;
  characterSlug: string;
  /** What the Edition must hold for the page to exist. */
  needs: { stance: string } | { move: string } | null;
}

function pageOf(pathname: string): PublicPage | null {
  const parts = pathname.split("/").map(decoded);
  if (parts[0] !== "" || parts[1] !== "games" || parts.some((p) => p === null)) return null;
  const [gameSlug, characterSlug, kind, key] = parts.slice(2) as string[];
  if (!gameSlug || !characterSlug) return null;
  if (parts.length === 4) return { gameSlug, characterSlug, needs: null };
  if (parts.length !== 6 || !key) return null;
  if (kind === "stances") return { gameSlug, characterSlug, needs: { stance: key } };
  if (kind === "explore") return { gameSlug, characterSlug, needs: { move: key } };
  return null;
}

/** The published Edition of a public game an address shows, when there is one, with the game's catalog. */
async function shown(pathname: string, editionOf: (catalog: PublicCatalog) => EditionSummary | undefined) {
  const page = pageOf(pathname);
  if (!page) return null;
  const catalog = await publicCatalog(page.gameSlug);
  const character = catalog?.characters.find((c) => c.slug === page.characterSlug);
  const edition = catalog ? editionOf(catalog) : undefined;
  if (!catalog || !character || edition?.status !== "published") return null;
  if (page.needs) {
    const index = await editionIndex(edition.id, character.id);
    if ("stance" in page.needs ? !index.stances.has(page.needs.stance) : !index.moves.has(page.needs.move)) {
      return null;
    }
  }
  return { catalog, edition };
}

/**
 * How long a shared cache in front of the app (a CDN) may keep a cached page;
 * Next's own header would say a year. Inside the app a new Edition makes new
 * addresses, but the public address stays the same:
 * - a page pinned by `?edition=` lists the game's Editions, which grows when
 *   the next one is published: five minutes, then a day of serving the old
 *   copy while it is checked again;
 * - the newest Edition (no `?edition=`) is replaced by the next one: a minute;
 * - a link can be revoked, and whether it still opens is read at most once a
 *   second (LINK_STATE_SECONDS): a second, so a revoked link stops within two.
 * Browsers keep none of them (no max-age). The app's own shared cache
 * (scripts/shared-cache.mjs) keeps them the same way.
 */
export const PUBLISHED_PAGE_CACHE = {
  edition: "public, s-maxage=300, stale-while-revalidate=86400",
  newest: "public, s-maxage=60, stale-while-revalidate=600",
  link: "public, s-maxage=1",
} as const;

/** Where the proxy sends a public address, and the Cache-Control of the answer. */
export interface PublishedTarget {
  path: string;
  cacheControl: string;
}

/**
 * The cached route for a public address, or null when the live route must
 * answer. `pathname` is the address's path as sent; `search` its query.
 */
export async function publishedAddress(pathname: string, search: URLSearchParams): Promise<PublishedTarget | null> {
  const link = linkSlug(pathname);
  // A link with a query (a stance sheet's filter) is rendered live: the cached copy has none.
  if (link !== null) {
    return search.size === 0 && (await isCacheableLink(link))
      ? { path: `${LINKS_PREFIX}/${link}`, cacheControl: PUBLISHED_PAGE_CACHE.link }
      : null;
  }
  const wanted = search.getAll("edition");
  if (wanted.length > 1) return null;
  const found = await shown(pathname, (catalog) =>
    wanted.length === 0 ? catalog.editions[0] : catalog.editions.find((e) => e.slug === wanted[0]),
  );
  if (!found) return null;
  return {
    path: `${PUBLISHED_PREFIX}/${found.edition.id}/${found.catalog.signature}${pathname}`,
    cacheControl: wanted.length === 0 ? PUBLISHED_PAGE_CACHE.newest : PUBLISHED_PAGE_CACHE.edition,
  };
}

/**
 * Whether a cached route's own address is one `publishedAddress` gives now.
 * Next's client router may ask for it directly; any other (a made-up Edition
 * or signature) is refused before it could make a page, so strangers cannot
 * fill the cache.
 */
export async function isPublishedAddress(pathname: string): Promise<boolean> {
  if (pathname.startsWith(`${LINKS_PREFIX}/`)) {
    const link = linkSlug(`/s/${pathname.slice(LINKS_PREFIX.length + 1)}`);
    return link !== null && (await isCacheableLink(link));
  }
  const [, prefix, editionId, signature, ...rest] = pathname.split("/");
  if (`/${prefix}` !== PUBLISHED_PREFIX || !editionId || !signature) return false;
  const found = await shown(`/${rest.join("/")}`, (catalog) =>
    catalog.editions.find((e) => String(e.id) === editionId),
  );
  return found?.catalog.signature === signature;
}

/**
 * What a cached page needs, from its own address: the public game, its
 * Editions, the published Edition and the character. Anything else is the
 * app's not-found, never a page of a draft or of a team's game.
 */
export const loadPublished = cache(async (editionId: string, gameSlug: string, characterSlug: string) => {
  const read = await readCatalog(gameSlug);
  const catalog = read === "team" ? null : read;
  const edition = catalog?.editions.find((e) => String(e.id) === editionId);
  const character = catalog?.characters.find((c) => c.slug === characterSlug);
  if (!catalog || !edition || edition.status !== "published" || !character) notFound();
  return { game: catalog.game, editions: catalog.editions, edition, character };
});

/**
 * Characters of public games, by id, with their game's slug, so a repeat
 * request for one reads nothing but the game's catalog (itself kept
 * CATALOG_SECONDS). Only characters the database showed to be in a public
 * game are kept: a team's character or a made-up id is never remembered.
 */
const publicCharacterGames = new LRUCache<number, string>({ max: 10_000 });

/** A character of a public game, with that game's catalog. */
export interface PublicCharacter {
  catalog: PublicCatalog;
  character: CharacterSummary;
}

/**
 * The public character with this id and its game's catalog, or null. Without
 * `gameSlug` only a character remembered from an earlier call is found, and
 * nothing is read for one never seen (the caller then reads the character
 * itself, checks who may read it, and calls again with the slug of its game
 * when that game is public). Null too when the game is no longer public or
 * the character no longer in it; the id is then forgotten.
 */
export async function publicCharacter(characterId: number, gameSlug?: string): Promise<PublicCharacter | null> {
  const slug = gameSlug ?? publicCharacterGames.get(characterId);
  if (slug === undefined) return null;
  const catalog = await publicCatalog(slug);
  const character = catalog?.characters.find((c) => c.id === characterId);
  if (!catalog || !character) {
    publicCharacterGames.delete(characterId);
    return null;
  }
  publicCharacterGames.set(characterId, slug);
  return { catalog, character };
}

/** Forgets which characters are public (tests). */
export function forgetPublicCharacters(): void {
  publicCharacterGames.clear();
}
