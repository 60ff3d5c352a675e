import { randomUUID } from "node:crypto";
import { expect, type APIRequestContext, type Browser, type Page } from "@playwright/test";
import { query } from "./db";
import { personWithPassword, signInOverHttp } from "./http";

/**
 * The public addresses the proxy sends to a cached copy when their Edition is published
 * (src/server/published.ts), one line per kind of page. Each names a page of Tarrow's, so it
 * reads the same in the demo game and in a team game with the demo's Tarrow imported: the tests
 * of test/e2e/published-cache.spec.ts check every line as the demo's page (from the cache) and as
 * a team's page (never cached, never shown to a stranger).
 */
export const CACHED_PAGES: { what: string; path: (game: string) => string }[] = [
  { what: "Tarrow's move list", path: (game) => `/games/${game}/tarrow` },
  { what: "Tarrow's Drift stance sheet", path: (game) => `/games/${game}/tarrow/stances/drift` },
  { what: "Tarrow's n in the Explorer", path: (game) => `/games/${game}/tarrow/explore/n` },
];

/**
 * What a response says about caching: Next's cache header, the Cache-Status of the app's shared
 * cache in front of Next (scripts/shared-cache.mjs) and the Cache-Control shared caches obey.
 */
export function cachingOf(headers: Record<string, string>) {
  return {
    nextCache: headers["x-nextjs-cache"] ?? null,
    sharedCache: headers["cache-status"] ?? null,
    cacheControl: headers["cache-control"] ?? "",
  };
}

/** Sent from a cache: Next's (its header says HIT) or the shared cache in front of it (a hit). */
export function servedFromCache(headers: Record<string, string>): boolean {
  const { nextCache, sharedCache } = cachingOf(headers);
  return nextCache === "HIT" || /^framefork; hit\b/.test(sharedCache ?? "");
}

/**
 * A page rendered for this request: from no cache, and nothing a shared cache may keep
 * (RFC 9111 §5.2.2.9: only `public` lets a shared cache store an answer to a request with
 * credentials).
 */
export function expectRenderedFresh(headers: Record<string, string>, where: string) {
  const { nextCache, sharedCache, cacheControl } = cachingOf(headers);
  expect(nextCache, `${where}: x-nextjs-cache`).toBeNull();
  expect(sharedCache, `${where}: cache-status`).toBeNull();
  expect(cacheControl, `${where}: cache-control`).not.toMatch(/\bpublic\b/i);
}

/** A new person, signed in over HTTP, in a browser context of their own. */
export async function signedIn(browser: Browser, baseURL: string, tag: string) {
  const person = await personWithPassword(tag);
  const { session } = await signInOverHttp(baseURL, person);
  const context = await browser.newContext();
  await context.addCookies(
    session.filter((c) => c.value !== "").map((c) => ({ name: c.name, value: c.value, url: baseURL })),
  );
  return { person, context, page: await context.newPage() };
}

/**
 * A team with this person as its coach, and a game of its own with the demo game's rules
 * (read from the demo's row, so the block classes are drawn with the same thresholds) and the
 * demo's Tarrow of Edition 1-1 imported from the demo's own export file, through the same
 * routes a coach's browser uses. Published when asked: then it is the demo's 1-1 in a team's game.
 */
export async function teamGameWithDemoTarrow(coach: Page, coachEmail: string, { publish }: { publish: boolean }) {
  const tag = randomUUID().slice(0, 8);
  const teamSlug = `night-shift-${tag}`;
  const gameName = `Mirror Circuit ${tag}`;
  await query("insert into teams (slug, name) values (?, ?)", [teamSlug, `Night Shift ${tag}`]);
  const [team] = await query<{ id: number }>("select id from teams where slug = ?", [teamSlug]);
  await query("insert into memberships (team_id, user_id, role) select ?, id, 'coach' from users where email = ?", [
    team!.id,
    coachEmail,
  ]);
  const [rules] = await query<{
    fps: number;
    fastest: number;
    launch_at: number;
    range_kind: "label" | "number";
    range_unit: string | null;
  }>("select fps, fastest, launch_at, range_kind, range_unit from games where slug = 'vesper-circuit'");
  const made = await coach.request.post(`/api/teams/${teamSlug}/games`, {
    data: {
      name: gameName,
      fps: rules!.fps,
      fastest: rules!.fastest,
      launchAt: rules!.launch_at,
      rangeKind: rules!.range_kind,
      rangeUnit: rules!.range_unit,
      edition: "1.1",
    },
  });
  expect(made.status(), await made.text()).toBe(201);
  const { game, edition } = (await made.json()) as { game: { slug: string }; edition: { slug: string } };
  const character = await coach.request.post(`/api/games/${game.slug}/characters`, { data: { name: "Tarrow" } });
  expect(character.status(), await character.text()).toBe(201);
  const file = await coach.request.get("/api/games/vesper-circuit/editions/1-1/characters/tarrow/export");
  expect(file.status()).toBe(200);
  const imported = await coach.request.post(
    `/api/games/${game.slug}/editions/${edition.slug}/characters/tarrow/import`,
    {
      multipart: { file: { name: "tarrow.csv", mimeType: "text/csv", buffer: await file.body() } },
    },
  );
  expect(imported.status(), await imported.text()).toBe(200);
  if (publish) {
    const published = await coach.request.post(`/api/games/${game.slug}/editions/${edition.slug}/publish`);
    expect(published.status(), await published.text()).toBe(200);
  }
  return { teamId: team!.id, teamSlug, game: game.slug, gameName, edition: edition.slug };
}

/**
 * The cached copy's own address for a public page, as the proxy sends the page there: Next
 * names a proxy's rewrite in the answer's `x-middleware-rewrite` header. It is a path, which Next
 * serves itself; a full URL there would mean Next took the rewrite for another origin's and
 * fetched the page over HTTP from itself.
 */
export async function cachedAddressOf(request: APIRequestContext, publicPath: string): Promise<string> {
  const res = await request.get(publicPath);
  expect(res.status(), publicPath).toBe(200);
  const rewrite = res.headers()["x-middleware-rewrite"];
  expect(rewrite, `${publicPath} is sent to a cached copy`).toMatch(/^\/published\//);
  return rewrite!.split("?")[0]!;
}
