import { randomBytes, randomUUID } from "node:crypto";
import { expect, test, type APIResponse } from "@playwright/test";
import { query } from "./db";
import { actionId, parseSetCookie, personWithPassword, signInOverHttp, withSecondServer, type SetCookie } from "./http";

// What the production build answers over HTTP, read without a browser: headers, cookies,
// refusals. Where a check follows an outside rule, the rule is named beside it.

test.beforeEach(async () => {
  // Sign-in is rate limited per address, and every request here comes from 127.0.0.1.
  await query("delete from rate_limits");
});

// OWASP Secure Headers Project (owasp.org/www-project-secure-headers) and OWASP's HTTP Headers
// Cheat Sheet: a CSP that forbids framing and foreign scripts, nosniff, a referrer policy,
// a permissions policy, and nothing that names the server software.
function expectSecurityHeaders(res: APIResponse, what: string) {
  const h = res.headers();
  expect(h["content-security-policy"], what).toContain("default-src 'self'");
  expect(h["content-security-policy"], what).toContain("frame-ancestors 'none'");
  expect(h["content-security-policy"], what).toContain("object-src 'none'");
  expect(h["x-content-type-options"], what).toBe("nosniff");
  expect(h["x-frame-options"], what).toBe("DENY");
  expect(h["referrer-policy"], what).toBe("strict-origin-when-cross-origin");
  expect(h["permissions-policy"], what).toContain("camera=()");
  expect(h["x-powered-by"], what).toBeUndefined();
}

test("pages, JSON answers and our own error answers all carry the security headers; no HSTS over http", async ({
  request,
}) => {
  for (const path of [
    "/",
    "/games",
    "/api/health",
    "/api/characters/987654321/graph",
    "/games/%E0%A4%A",
    "/api/x/%zz",
  ]) {
    const res = await request.get(path);
    expectSecurityHeaders(res, path);
    // RFC 6797 §7.2: a host sends Strict-Transport-Security over https only.
    expect(res.headers()["strict-transport-security"], path).toBeUndefined();
  }
});

test("the graph API of the demo's published Edition reaches the client with its ETag and public caching, and a matching If-None-Match is 304 with no body", async ({
  request,
}) => {
  const [tarrow] = await query<{ id: number }>(
    "select c.id from characters c join games g on g.id = c.game_id where g.slug = 'vesper-circuit' and c.slug = 'tarrow'",
  );
  const path = `/api/characters/${tarrow!.id}/graph?edition=1-1`;
  const res = await request.get(path);
  expect(res.status()).toBe(200);
  const { etag, "cache-control": cacheControl } = res.headers();
  // RFC 9110 §8.8.3: a strong entity tag is a quoted string; RFC 9111 §5.2.2.9: "public".
  expect(etag).toMatch(/^"[\w-]+"$/);
  expect(cacheControl).toMatch(/^public, max-age=\d+/);

  // RFC 9110 §13.1.2 and §15.4.5: the same validator and caching headers, no body.
  const again = await request.get(path, { headers: { "if-none-match": etag! } });
  expect(again.status()).toBe(304);
  expect(again.headers()).toMatchObject({ etag, "cache-control": cacheControl });
  expect((await again.body()).length).toBe(0);
});

test("an address with a broken %-escape answers our 400 JSON on the API and our not-found page elsewhere, never the framework's 500", async ({
  request,
}) => {
  // RFC 3986 §2.1: "%" must be followed by two hex digits; these also fail UTF-8 decoding (truncated,
  // not hex, overlong, a lone surrogate).
  const broken = ["%E0%A4%A", "%zz", "%", "%C0%AF", "%ED%A0%80"];
  const pages = [
    "/invites/X",
    "/s/X",
    "/games/X",
    "/games/vesper-circuit/X",
    "/games/vesper-circuit/tarrow/explore/X",
    "/teams/X",
    "/X",
  ];
  const apis = ["/api/characters/X/graph", "/api/teams/X/members", "/api/teams/X/permalinks"];
  for (const bad of broken) {
    for (const path of pages.map((p) => p.replace("X", bad))) {
      const res = await request.get(path);
      expect(res.status(), path).toBe(404);
      expect(res.headers()["content-type"], path).toContain("text/html");
      expect(await res.text(), path).toContain("Not here");
    }
    for (const path of apis.map((p) => p.replace("X", bad))) {
      const res = await request.get(path);
      expect(res.status(), path).toBe(400);
      const body = (await res.json()) as { error: { code: string; message: string } };
      expect(body.error.code, path).toBe("bad_request");
      expect(body.error.message, path).toMatch(/address is not valid/);
    }
  }
  // A change sent to a broken address is refused the same way.
  const del = await request.delete("/api/permalinks/%E0%A4%A");
  expect(del.status()).toBe(400);
});

/** The cookie named `name` (with or without a prefix) among `cookies`. */
const cookie = (cookies: SetCookie[], name: string) => cookies.find((c) => c.name.endsWith(name));

test("over http the session and CSRF cookies are HttpOnly and SameSite=Lax, without Secure", async ({ baseURL }) => {
  const person = await personWithPassword("cookies");
  const { csrf, session } = await signInOverHttp(baseURL!, person);
  // OWASP Session Management Cheat Sheet: session cookies HttpOnly and SameSite; Secure needs https.
  for (const [found, name] of [
    [cookie(csrf, "next-auth.csrf-token"), "next-auth.csrf-token"],
    [cookie(session, "next-auth.session-token"), "next-auth.session-token"],
  ] as const) {
    expect(found, name).toBeDefined();
    expect(found!.name, name).toBe(name);
    expect(found!.attributes.has("httponly"), name).toBe(true);
    expect(found!.attributes.get("samesite")?.toLowerCase(), name).toBe("lax");
    expect(found!.attributes.get("path"), name).toBe("/");
    expect(found!.attributes.has("secure"), name).toBe(false);
  }
});

test("behind https (NEXTAUTH_URL https) the cookies are Secure with the __Host-/__Secure- prefixes, and HSTS is sent", async () => {
  test.setTimeout(90_000);
  const person = await personWithPassword("secure");
  await withSecondServer(
    (base) => ({ NEXTAUTH_URL: base.replace("http:", "https:") }),
    async (base) => {
      const { csrf, session } = await signInOverHttp(base, person);
      // RFC 6265bis §4.1.3: "__Host-" needs Secure, Path=/ and no Domain; "__Secure-" needs Secure.
      const csrfCookie = cookie(csrf, "next-auth.csrf-token");
      expect(csrfCookie?.name).toBe("__Host-next-auth.csrf-token");
      expect(csrfCookie?.attributes.has("secure")).toBe(true);
      expect(csrfCookie?.attributes.has("domain")).toBe(false);
      const sessionCookie = cookie(session, "next-auth.session-token");
      expect(sessionCookie?.name).toBe("__Secure-next-auth.session-token");
      for (const c of [csrfCookie!, sessionCookie!]) {
        expect(c.attributes.has("secure"), c.name).toBe(true);
        expect(c.attributes.has("httponly"), c.name).toBe(true);
        expect(c.attributes.get("samesite")?.toLowerCase(), c.name).toBe("lax");
        expect(c.attributes.get("path"), c.name).toBe("/");
      }
      // RFC 6797: HSTS with a max-age, on pages and API answers alike.
      for (const path of ["/", "/games", "/api/characters/987654321/graph"]) {
        const res = await fetch(`${base}${path}`);
        expect(res.headers.get("strict-transport-security"), path).toMatch(/^max-age=\d{7,}/);
      }
    },
  );
});

test("a change requested from another site is refused with 403 and does nothing: route handlers and server actions", async ({
  baseURL,
}) => {
  const person = await personWithPassword("origin");
  const { session } = await signInOverHttp(baseURL!, person);
  const sessionCookie = session.map((c) => `${c.name}=${c.value}`).join("; ");
  const teamsOf = async () =>
    (await query<{ n: number }>("select count(*) as n from memberships where user_id = ?", [person.id]))[0]!.n;

  // OWASP CSRF Prevention Cheat Sheet: compare Origin with the target origin; refuse Sec-Fetch-Site: cross-site.
  const createTeam = (headers: Record<string, string>) =>
    fetch(`${baseURL}/api/teams`, {
      method: "POST",
      headers: { "content-type": "application/json", cookie: sessionCookie, ...headers },
      body: JSON.stringify({ name: `Origin Check ${randomUUID().slice(0, 6)}` }),
    });
  const foreign: Record<string, string>[] = [
    { origin: "https://attacker.example" },
    { origin: "null" },
    { "sec-fetch-site": "cross-site" },
  ];
  for (const headers of foreign) {
    const res = await createTeam(headers);
    expect(res.status, JSON.stringify(headers)).toBe(403);
    expect(((await res.json()) as { error: { code: string } }).error.code).toBe("forbidden");
  }
  expect(await teamsOf()).toBe(0);
  // The same request from our own pages goes through.
  expect((await createTeam({ origin: new URL(baseURL!).origin, "sec-fetch-site": "same-origin" })).status).toBe(201);
  expect(await teamsOf()).toBe(1);

  // A server action (the sign-up form's), posted as React posts it from the form (the form's
  // fields as _1_<name>, the arguments in field 0). Next's own check would
  // refuse a foreign Origin with a 500; ours answers 403 before it, and nothing is written.
  const email = `forged-${randomUUID().slice(0, 8)}@example.test`;
  const signUp = (origin: string) => {
    const form = new FormData();
    form.set("_1_name", "Forged Person");
    form.set("_1_email", email);
    form.set("_1_password", "long enough password");
    form.set("0", '[null,"$K1"]');
    return fetch(`${baseURL}/sign-up`, {
      method: "POST",
      headers: { origin, "next-action": actionId("src/app/(auth)/actions.ts", "signUp"), accept: "text/x-component" },
      body: form,
    });
  };
  const forged = await signUp("https://attacker.example");
  expect(forged.status).toBe(403);
  expect(await query("select id from users where email = ?", [email])).toEqual([]);
  // The very same post from our own origin runs the action: the refusal was the origin's doing.
  const own = await signUp(new URL(baseURL!).origin);
  expect(own.status).toBe(200);
  // Sign-up writes the account just after its answer (the answer is the same for every address).
  await expect
    .poll(async () => (await query("select id from users where email = ?", [email])).length, { timeout: 15_000 })
    .toBe(1);
});

/** A team's private game with two characters and two Editions, one move, and a link anyone may open. */
async function privateGameWithPublicLink() {
  const tag = randomUUID().slice(0, 8);
  const owner = await personWithPassword("owner");
  await query("insert into teams (slug, name) values (?, ?)", [`hidden-${tag}`, `Hidden ${tag}`]);
  const [team] = await query<{ id: number }>("select id from teams where slug = ?", [`hidden-${tag}`]);
  await query("insert into memberships (team_id, user_id, role) values (?, ?, 'owner')", [team!.id, owner.id]);
  await query("insert into games (slug, name, team_id) values (?, 'Hidden Game', ?)", [`hidden-game-${tag}`, team!.id]);
  const [game] = await query<{ id: number }>("select id from games where slug = ?", [`hidden-game-${tag}`]);
  await query(
    "insert into editions (game_id, slug, name, released_on) values (?, 'a', 'Sealed Build', '2026-01-01'), (?, 'b', 'Sealed Rebuild', '2026-06-01')",
    [game!.id, game!.id],
  );
  const [edition] = await query<{ id: number }>("select id from editions where game_id = ? and slug = 'a'", [game!.id]);
  await query(
    "insert into characters (game_id, slug, name) values (?, 'marrow', 'Marrow Kite'), (?, 'thistle', 'Thistlewhirr Dunmorrow-Q')",
    [game!.id, game!.id],
  );
  const [pinned] = await query<{ id: number }>("select id from characters where game_id = ? and slug = 'marrow'", [
    game!.id,
  ]);
  await query(
    `insert into moves (edition_id, character_id, \`key\`, input, name, level, damage, startup, on_block, on_hit, on_counter_hit, tags)
     values (?, ?, '1', '1', 'Quick Jab', 'high', 8, 10, '1', '8', '8', '[]')`,
    [edition!.id, pinned!.id],
  );
  const slug = randomBytes(18).toString("base64url");
  const view = { root: "1", path: null, options: { maxDepth: 8, maxStanceVisits: 1, fastest: 10 }, opponent: null };
  await query(
    "insert into permalinks (slug, team_id, created_by, visibility, edition_id, character_id, view, title) values (?, ?, ?, 'link', ?, ?, ?, 'Marrow Kite · 1 · edition a')",
    [slug, team!.id, owner.id, edition!.id, pinned!.id, JSON.stringify(view)],
  );
  return { slug, gameSlug: `hidden-game-${tag}`, characterId: pinned!.id };
}

test("a public link into a private game sends the browser its one character and Edition, nothing else of the game", async ({
  request,
}) => {
  const hidden = await privateGameWithPublicLink();
  const res = await request.get(`/s/${hidden.slug}`);
  expect(res.status()).toBe(200);
  // The HTML holds the page and the data handed to its client components (React's flight payload).
  const html = await res.text();
  expect(html).toContain("Marrow Kite");
  expect(html).toContain("Sealed Build");
  expect(html).not.toContain("Thistlewhirr Dunmorrow-Q");
  expect(html).not.toContain("Sealed Rebuild");
});

test("signed out, a private game's pages and its character's graph answer exactly as unknown ones do", async ({
  request,
}) => {
  const hidden = await privateGameWithPublicLink();
  const unknownGame = await request.get(`/games/no-such-game-${randomUUID().slice(0, 6)}`);
  for (const path of [`/games/${hidden.gameSlug}`, `/games/${hidden.gameSlug}/marrow`]) {
    const res = await request.get(path);
    expect(res.status(), path).toBe(unknownGame.status());
    expect(await res.text(), path).toContain("Not here");
  }
  const unknownId = 987_654_321;
  const unknown = await request.get(`/api/characters/${unknownId}/graph`);
  const mine = await request.get(`/api/characters/${hidden.characterId}/graph`);
  expect(mine.status()).toBe(404);
  expect(mine.status()).toBe(unknown.status());
  expect((await mine.text()).replace(String(hidden.characterId), "<id>")).toBe(
    (await unknown.text()).replace(String(unknownId), "<id>"),
  );
});

// Parsing is covered here too, so a cookie the app sets in an unexpected shape fails loudly.
test("the Set-Cookie reader keeps names, values and flags apart", () => {
  const c = parseSetCookie("__Host-x=a=b; Path=/; HttpOnly; Secure; SameSite=Lax");
  expect(c).toEqual({
    name: "__Host-x",
    value: "a=b",
    attributes: new Map([
      ["path", "/"],
      ["httponly", ""],
      ["secure", ""],
      ["samesite", "Lax"],
    ]),
  });
});
