import { randomBytes } from "node:crypto";
import { expect, test, type APIRequestContext, type Browser } from "@playwright/test";
import { query } from "./db";
import { ExplorerPage } from "./pages/explorer-page";
import { MoveListPage } from "./pages/move-list-page";
import {
  CACHED_PAGES,
  cachedAddressOf,
  expectRenderedFresh,
  servedFromCache,
  signedIn,
  teamGameWithDemoTarrow,
} from "./published";

// Issue 16, "Fast under load": the pages of a published Edition of a public game are rendered
// once and served from Next's cache, and then from the shared cache in front of Next
// (scripts/shared-cache.mjs) for as long as their Cache-Control lets one keep them; everything else (a draft, a team's game) is rendered for
// each request and checks who reads it (src/server/published.ts, src/proxy.ts). These tests
// check the promises that make that safe: a draft is never stale, a cached page shows the same
// figures as a fresh one, and a team's page never reaches a stranger, cached or not.

test.describe.configure({ timeout: 180_000 });

test.beforeEach(async ({}, testInfo) => {
  test.skip(testInfo.project.name !== "desktop", "what the server answers: one screen size is enough");
  // Sign-in is rate limited per address, and every request here comes from 127.0.0.1.
  await query("delete from rate_limits");
});

/** A coach signed in in a browser context of their own, with a team game holding the demo's Tarrow. */
async function coachWithTeamGame(browser: Browser, baseURL: string, publish: boolean) {
  const coach = await signedIn(browser, baseURL, "coach");
  return { coach, t: await teamGameWithDemoTarrow(coach.page, coach.person.email, { publish }) };
}

/** A link to Tarrow's n, written straight into the database, as another app server would. */
async function insertLink(link: {
  slug: string;
  teamId: number;
  userId: string;
  editionId: number;
  characterId: number;
  visibility: "team" | "link";
  title: string;
}) {
  const view = { root: "n", path: null, options: { maxDepth: 8, maxStanceVisits: 1, fastest: 11 }, opponent: null };
  await query(
    `insert into permalinks (slug, team_id, created_by, visibility, edition_id, character_id, view, title)
     values (?, ?, ?, ?, ?, ?, ?, ?)`,
    [
      link.slug,
      link.teamId,
      link.userId,
      link.visibility,
      link.editionId,
      link.characterId,
      JSON.stringify(view),
      link.title,
    ],
  );
}

/** Opens every string, once the page answers clicks (a click before hydration does nothing). */
async function openEveryString(list: MoveListPage) {
  await expect(async () => {
    await list.openAll();
    await expect(list.rows.first()).toBeVisible({ timeout: 2_000 });
  }).toPass({ timeout: 20_000 });
}

test("a draft Edition is never served from a cache: a coach changes a number, reloads, and sees the change", async ({
  browser,
  baseURL,
}) => {
  const { coach, t } = await coachWithTeamGame(browser, baseURL!, false);
  const page = coach.page;
  const list = new MoveListPage(page);
  const address = `/games/${t.game}/tarrow?edition=${t.edition}`;

  const first = await page.goto(address);
  expect(first?.status()).toBe(200);
  expectRenderedFresh(first!.headers(), "the draft's move list");
  await list.open("n");
  // Tarrow's n is +1 on block and 7 damage in the demo's 1-1 (src/server/db/seed/demo.ts).
  await expect(list.field("n", "onBlock")).toHaveText("+1");

  // The coach fixes the number in place, as the move list offers it on a draft.
  const row = list.row("n");
  await row.getByRole("button", { name: "Change the on block of n" }).click();
  await row.getByLabel("The on block of n").fill("-5");
  await page.keyboard.press("Enter");
  await expect(row.getByRole("button", { name: "Change the on block of n" })).toContainText("-5");

  const reloaded = await page.reload();
  expect(reloaded?.status()).toBe(200);
  expectRenderedFresh(reloaded!.headers(), "the draft's move list, reloaded");
  await list.open("n");
  await expect(list.field("n", "onBlock")).toHaveText("-5");

  // Someone else saves another number of it (the edit API); the next reload shows that too.
  const moveUrl = `/api/games/${t.game}/editions/${t.edition}/characters/tarrow/moves/n`;
  const now = (await (await page.request.get(moveUrl)).json()) as { version: number };
  const saved = await page.request.patch(moveUrl, { data: { version: now.version, changes: { damage: 9 } } });
  expect(saved.status(), await saved.text()).toBe(200);
  const again = await page.reload();
  expectRenderedFresh(again!.headers(), "the draft's move list, reloaded after the API's save");
  await list.open("n");
  await expect(list.row("n").locator('[data-field="damage"]').filter({ visible: true })).toHaveText("9");
  await expect(list.field("n", "onBlock")).toHaveText("-5");

  // The Explorer page of the move reads the draft as it is now, loaded and reloaded.
  const explorer = new ExplorerPage(page);
  for (const load of [() => page.goto(`/games/${t.game}/tarrow/explore/n?edition=${t.edition}`), () => page.reload()]) {
    const answer = await load();
    expect(answer?.status()).toBe(200);
    expectRenderedFresh(answer!.headers(), "the draft's Explorer page");
    await explorer.select("n");
    await expect(explorer.field("onBlock")).toContainText("-5");
    await expect(explorer.field("damage")).toContainText("9");
  }

  // Every kind of page the cache serves for a published Edition is rendered fresh for a draft.
  for (const p of CACHED_PAGES) {
    const answer = await page.request.get(`${p.path(t.game)}?edition=${t.edition}`);
    expect(answer.status(), p.what).toBe(200);
    expectRenderedFresh(answer.headers(), `the draft's ${p.what}`);
    expect(answer.headers()["x-middleware-rewrite"], `the draft's ${p.what}: sent to no cached copy`).toBeUndefined();
  }
  await coach.context.close();
});

test("a published Edition's move list shows the same figures served from the cache as rendered fresh", async ({
  browser,
  baseURL,
  request,
}) => {
  // The demo's Tarrow of 1-1, imported into a team's game with the demo's rules and published:
  // the team's page is rendered for each request (members only), the demo's comes from the cache.
  const { coach, t } = await coachWithTeamGame(browser, baseURL!, true);

  for (const p of CACHED_PAGES) {
    const demo = `${p.path("vesper-circuit")}?edition=1-1`;
    await request.get(demo); // the first request ever renders it (or another test did)
    const cached = await request.get(demo);
    expect(cached.status(), demo).toBe(200);
    expect(servedFromCache(cached.headers()), `${p.what}, demo, second request`).toBe(true);
    const team = await coach.page.request.get(`${p.path(t.game)}?edition=${t.edition}`);
    expect(team.status(), p.what).toBe(200);
    expectRenderedFresh(team.headers(), `${p.what}, team game`);
  }

  const visitor = await browser.newPage();
  const cachedList = new MoveListPage(visitor);
  const liveList = new MoveListPage(coach.page);
  let every = 0;
  // As it comes, then with filters and an order in the address: a cached page is rendered
  // without the query string, and the browser applies it (src/app/_shared/move-list-page.tsx).
  for (const filters of ["", "&level=low", "&ending=punishable&sort=startup+asc", "&startupFrom=12&startupTo=14"]) {
    const cachedAnswer = await visitor.goto(`/games/vesper-circuit/tarrow?edition=1-1${filters}`);
    expect(cachedAnswer?.status()).toBe(200);
    expect(servedFromCache(cachedAnswer!.headers()), `cached page ${filters}`).toBe(true);
    const liveAnswer = await coach.page.goto(`/games/${t.game}/tarrow?edition=${t.edition}${filters}`);
    expect(liveAnswer?.status()).toBe(200);
    expectRenderedFresh(liveAnswer!.headers(), `live page ${filters}`);

    await expect(liveList.strings.first()).toBeVisible();
    const fresh = await liveList.figures();
    if (filters === "") every = fresh.strings.length;
    // The filter keeps some strings and drops some: the comparison below is about a real choice.
    expect(fresh.strings.length, filters).toBeGreaterThan(0);
    if (filters !== "") expect(fresh.strings.length, filters).toBeLessThan(every);
    await expect.poll(() => cachedList.figures(), { message: `closed strings ${filters}` }).toEqual(fresh);

    await openEveryString(liveList);
    await openEveryString(cachedList);
    const freshOpen = await liveList.figures();
    expect(freshOpen.steps.length, filters).toBeGreaterThan(freshOpen.strings.length);
    expect(freshOpen.steps.filter((s) => s.onBlock.length === 1).length, filters).toBe(freshOpen.steps.length);
    await expect.poll(() => cachedList.figures(), { message: `every string open ${filters}` }).toEqual(freshOpen);
  }
  expect(every).toBeGreaterThan(5);
  await visitor.close();
  await coach.context.close();
});

test("a team's published pages, graph data and team-only links reach its members only, and never from a cache", async ({
  browser,
  baseURL,
  playwright,
}) => {
  const { coach, t } = await coachWithTeamGame(browser, baseURL!, true);
  // A team-only link to Tarrow in the team's published Edition.
  const linkSlug = randomBytes(18).toString("base64url");
  const linkTitle = `Team-only drill ${linkSlug.slice(0, 8)}`;
  const [where] = await query<{ editionId: number; characterId: number; userId: string }>(
    `select e.id as editionId, c.id as characterId, u.id as userId
       from games g join editions e on e.game_id = g.id join characters c on c.game_id = g.id, users u
     where g.slug = ? and c.slug = 'tarrow' and u.email = ?`,
    [t.game, coach.person.email],
  );
  await insertLink({
    slug: linkSlug,
    teamId: t.teamId,
    userId: where!.userId,
    editionId: where!.editionId,
    characterId: where!.characterId,
    visibility: "team",
    title: linkTitle,
  });

  const addresses = [
    ...CACHED_PAGES.flatMap((p) => [p.path(t.game), `${p.path(t.game)}?edition=${t.edition}`]),
    `/api/characters/${where!.characterId}/graph`,
    `/api/characters/${where!.characterId}/graph?edition=${t.edition}`,
    `/s/${linkSlug}`,
  ];
  // A member reads each twice: a cache that kept the first answer would give the second.
  for (const address of addresses) {
    for (const n of [1, 2]) {
      const res = await coach.page.request.get(address);
      expect(res.status(), `member, ${address}, ${n}`).toBe(200);
      expectRenderedFresh(res.headers(), `member, ${address}, ${n}`);
      expect(res.headers()["x-middleware-rewrite"], `member, ${address}: sent to no cached copy`).toBeUndefined();
    }
  }
  expect(await (await coach.page.request.get(`/s/${linkSlug}`)).text()).toContain(linkTitle);

  // Then a signed-out visitor and a signed-in person of no team get "not found", with none of it.
  const anonymous = await playwright.request.newContext({ baseURL });
  const outsider = await signedIn(browser, baseURL!, "outsider");
  const strangers: [string, APIRequestContext][] = [
    ["signed out", anonymous],
    ["signed in, not a member", outsider.page.request],
  ];
  for (const [who, visitor] of strangers) {
    for (const address of addresses) {
      const res = await visitor.get(address, { maxRedirects: 0 });
      expect(res.status(), `${who}, ${address}`).toBe(404);
      expectRenderedFresh(res.headers(), `${who}, ${address}`);
      const html = await res.text();
      expect(html.includes(t.gameName), `${who} read the game's name at ${address}`).toBe(false);
      expect(html.includes(linkTitle), `${who} read the link's title at ${address}`).toBe(false);
    }
  }
  await anonymous.dispose();
  await outsider.context.close();
  await coach.context.close();
});

test("a cached copy answers only at the address the proxy sends a public page to", async ({ request }) => {
  const [demo] = await query<{ id: number }>(
    "select e.id from editions e join games g on g.id = e.game_id where g.slug = 'vesper-circuit' and e.slug = '1-1'",
  );
  for (const p of CACHED_PAGES) {
    const cached = await cachedAddressOf(request, `${p.path("vesper-circuit")}?edition=1-1`);
    // "/published/{Edition id}/{signature of the game's catalog}/games/vesper-circuit/..."
    const [, , editionId, signature, ...rest] = cached.split("/");
    expect(editionId, p.what).toBe(String(demo!.id));
    expect(`/${rest.join("/")}`).toBe(p.path("vesper-circuit"));
    const ok = await request.get(cached);
    expect(ok.status(), cached).toBe(200);
    expect(await ok.text()).toContain("Tarrow");

    const madeUp = [
      `/published/${demo!.id}/${signature!.replace(/^./, (c) => (c === "A" ? "B" : "A"))}/${rest.join("/")}`,
      `/published/${demo!.id}/${randomBytes(12).toString("base64url")}/${rest.join("/")}`,
      `/published/999999999/${signature}/${rest.join("/")}`,
      `/published/0/${signature}/${rest.join("/")}`,
      `/published/${demo!.id}/${signature}/games/vesper-circuit/nobody`,
      `/published/${demo!.id}/${signature}/games/no-such-game/tarrow`,
      `/published/${demo!.id}/${signature}`,
      "/published",
    ];
    for (const address of madeUp) {
      const res = await request.get(address, { maxRedirects: 0 });
      expect(res.status(), address).toBe(404);
      expect(await res.text()).not.toContain("Tarrow");
    }
  }
});

test("a team's published Edition has no cached copy, whatever its address", async ({ browser, baseURL, request }) => {
  const { coach, t } = await coachWithTeamGame(browser, baseURL!, true);
  const [team] = await query<{ id: number }>(
    "select e.id from editions e join games g on g.id = e.game_id where g.slug = ?",
    [t.game],
  );
  const demoCached = await cachedAddressOf(request, "/games/vesper-circuit/tarrow?edition=1-1");
  const demoSignature = demoCached.split("/")[3]!;
  for (const p of CACHED_PAGES) {
    for (const address of [
      `/published/${team!.id}/${demoSignature}${p.path(t.game)}`,
      `/published/${team!.id}/${demoSignature}${p.path("vesper-circuit")}`,
      `/published/${team!.id}/${randomBytes(12).toString("base64url")}${p.path(t.game)}`,
    ]) {
      // Neither a member nor a stranger gets the team's page at a cached address.
      for (const [who, visitor] of [
        ["member", coach.page.request],
        ["signed out", request],
      ] as const) {
        const res = await visitor.get(address, { maxRedirects: 0 });
        expect(res.status(), `${who}, ${address}`).toBe(404);
        expect(await res.text(), `${who}, ${address}`).not.toContain(t.gameName);
      }
    }
  }
  await coach.context.close();
});

test("what a shared cache in front of the app may keep: a pinned page five minutes, the newest Edition's a minute, a link a second, and a link revoked elsewhere stops within two", async ({
  request,
}) => {
  // RFC 9111 §5.2.2.10: s-maxage speaks to shared caches only; with no max-age, browsers keep none.
  for (const p of CACHED_PAGES) {
    const pinned = await request.get(`${p.path("vesper-circuit")}?edition=1-1`);
    expect(pinned.headers()["cache-control"], `${p.what}, ?edition=1-1`).toBe(
      "public, s-maxage=300, stale-while-revalidate=86400",
    );
    // The app's own shared cache (scripts/shared-cache.mjs) keeps it: the next request is a hit.
    const again = await request.get(`${p.path("vesper-circuit")}?edition=1-1`);
    expect(again.headers()["cache-status"], `${p.what}, again`).toMatch(/^framefork; hit; ttl=\d+$/);
    expect(await again.text()).toBe(await pinned.text());
    const newest = await request.get(p.path("vesper-circuit"));
    expect(newest.headers()["cache-control"], `${p.what}, the newest`).toBe(
      "public, s-maxage=60, stale-while-revalidate=600",
    );
  }

  // A link anyone may open to the demo's Tarrow in 1-1, from a team and person of this test's own.
  const tag = randomBytes(6).toString("hex");
  const userId = `cache-${tag}`;
  await query("insert into users (id, name, email) values (?, ?, ?)", [
    userId,
    "Cache Coach",
    `${userId}@example.test`,
  ]);
  await query("insert into teams (slug, name) values (?, ?)", [`cache-${tag}`, `Cache ${tag}`]);
  const [where] = await query<{ teamId: number; editionId: number; characterId: number }>(
    `select t.id as teamId, e.id as editionId, c.id as characterId
       from teams t, games g join editions e on e.game_id = g.id join characters c on c.game_id = g.id
     where t.slug = ? and g.slug = 'vesper-circuit' and e.slug = '1-1' and c.slug = 'tarrow'`,
    [`cache-${tag}`],
  );
  const slug = randomBytes(18).toString("base64url");
  const title = `Open drill ${tag}`;
  await insertLink({ slug, userId, ...where!, visibility: "link", title });
  expect(await cachedAddressOf(request, `/s/${slug}`)).toBe(`/published/links/${slug}`);
  const link = await request.get(`/s/${slug}`);
  expect(await link.text()).toContain(title);
  expect(link.headers()["cache-control"]).toBe("public, s-maxage=1");

  // Revoked by a change this server did not make (another app server's, say): within two seconds
  // (the shared cache's one, then LINK_STATE_SECONDS) the link is gone, from its cached copy's
  // address too.
  await query("update permalinks set revoked_at = now() where slug = ?", [slug]);
  await expect(async () => {
    const gone = await request.get(`/s/${slug}`);
    expect(gone.headers()["x-middleware-rewrite"]).toBeUndefined();
    expect(await gone.text()).not.toContain(title);
  }).toPass({ timeout: 3_000, intervals: [250] });
  const direct = await request.get(`/published/links/${slug}`);
  expect(direct.status()).toBe(404);
  expect(await direct.text()).not.toContain(title);
});
