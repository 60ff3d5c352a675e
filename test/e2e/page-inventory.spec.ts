import { createHash, randomBytes, randomUUID } from "node:crypto";
import { readdirSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import { expect, request, test, type APIRequestContext } from "@playwright/test";
import { query } from "./db";
import { signUpAs } from "./pages/team-pages";
import { cachedAddressOf } from "./published";

// The page inventory, beside the route inventory of the role matrix: every page, not-found page
// and link-preview image under src/app has a row, and each row says what each kind of visitor
// gets: the page (200), "not found" (404) or the way to sign in. Run over HTTP against the
// production build, each visitor with their own signed-in cookies, so what is checked is exactly
// what a browser or a link-preview fetcher receives, <head> (title, og tags) included.
// A stranger (signed out, or signed in to another team) must never find a private name in it.

const VISITORS = ["anonymous", "viewer", "player", "coach", "owner", "outsider"] as const;
type Visitor = (typeof VISITORS)[number];
const MEMBERS = ["viewer", "player", "coach", "owner"] as const;
type Member = (typeof MEMBERS)[number];
const isStranger = (v: Visitor) => v === "anonymous" || v === "outsider";

/** What a visit answers: the page, not found, sent to sign in, or sent home (a signed-in visitor on a sign-in page). */
type Answer = 200 | 404 | "sign-in" | "home";

const tag = randomUUID().slice(0, 8);
/** Team A's private things, and the pages that name them. Each is unique to this run, so a hit is a real leak. */
const data = {
  teamSlug: `private-crew-${tag}`,
  teamName: `Quiet Harbor ${tag}`,
  gameSlug: `private-game-${tag}`,
  gameName: `Undisclosed Circuit ${tag}`,
  characterName: `Hidden Lantern ${tag}`,
  moveName: `Secret Sweep ${tag}`,
  stanceName: `Hushed Crouch ${tag}`,
  stanceTeamOnlyTitle: `Team-only stance sheet ${tag}`,
  stanceTeamOnlySlug: randomBytes(18).toString("base64url"),
  stanceLinkSlug: randomBytes(18).toString("base64url"),
  teamOnlyTitle: `Team-only drill ${tag}`,
  linkTitle: `Open drill ${tag}`,
  /** Given, not drawn by AUTO_INCREMENT: the table of pages is built before team A is. */
  boardId: 1_000_000_000 + Math.floor(Math.random() * 1_000_000_000),
  boardTitle: `Secret split ${tag}`,
  boardSituation: `Hidden guess ${tag}`,
  boardTeamOnlySlug: randomBytes(18).toString("base64url"),
  boardLinkSlug: randomBytes(18).toString("base64url"),
  teamOnlySlug: randomBytes(18).toString("base64url"),
  linkSlug: randomBytes(18).toString("base64url"),
  inviteToken: randomBytes(32).toString("base64url"),
  inviteEmail: `invitee-${tag}@example.test`,
  people: Object.fromEntries(
    (["viewer", "player", "coach", "owner", "outsider"] as const).map((v) => [
      v,
      { name: `${v[0]!.toUpperCase()}${v.slice(1)} ${tag}`, email: `${v}-${tag}@example.test` },
    ]),
  ) as Record<Exclude<Visitor, "anonymous">, { name: string; email: string }>,
};

type Secret =
  | "team"
  | "game"
  | "character"
  | "move"
  | "stance"
  | "team-only link"
  | "team-only stance link"
  | "board"
  | "board's situation"
  | `${Member}'s name`
  | `${Member}'s e-mail`;
/** What a stranger must not read anywhere in a page of team A's, by name. */
const SECRETS: Record<Secret, string> = {
  team: data.teamName,
  game: data.gameName,
  character: data.characterName,
  move: data.moveName,
  stance: data.stanceName,
  "team-only link": data.teamOnlyTitle,
  "team-only stance link": data.stanceTeamOnlyTitle,
  board: data.boardTitle,
  "board's situation": data.boardSituation,
  ...(Object.fromEntries(
    MEMBERS.flatMap((v) => [
      [`${v}'s name`, data.people[v].name],
      [`${v}'s e-mail`, data.people[v].email],
    ]),
  ) as Record<`${Member}'s name` | `${Member}'s e-mail`, string>),
};

interface Target {
  /** What the address shows, for the failure message. */
  what: string;
  /** The address, or how to find it when it is known only once the app runs. */
  path: string | (() => Promise<string>);
  expect: Record<Visitor, Answer>;
  /** Private names a member must see here: proof that the stranger's check looks at the right page. */
  membersSee?: Secret[];
  /** Names this page shows to anyone who has its address, by design (and why in `what`). */
  disclosed?: Secret[];
}

const all = (answer: Answer): Record<Visitor, Answer> =>
  Object.fromEntries(VISITORS.map((v) => [v, answer])) as Record<Visitor, Answer>;
const membersOnly = (stranger: Answer = 404): Record<Visitor, Answer> => ({
  ...all(200),
  anonymous: stranger,
  outsider: 404,
});
const signedIn: Record<Visitor, Answer> = { ...all(200), anonymous: "sign-in" };
const signedOut: Record<Visitor, Answer> = { ...all("home"), anonymous: 200 };

const demoMove = "/games/vesper-circuit/tarrow/explore/v";
/** Where the proxy sends the demo's Tarrow move list of 1-1 (the address names the Edition and a signature). */
const demoCachedMoveList = () =>
  cachedAddressOf(visitors.get("anonymous")!, "/games/vesper-circuit/tarrow?edition=1-1");
const privateCharacter = `/games/${data.gameSlug}/hidden-lantern`;

/**
 * The one table: every file under src/app that answers a visit (page, not-found page, link-preview
 * image) → the addresses that reach it, and what each visitor gets there. A file with no row fails.
 */
const PAGES: Record<string, Target[]> = {
  "page.tsx": [{ what: "the landing page", path: "/", expect: all(200) }],
  "help/page.tsx": [{ what: "help", path: "/help", expect: all(200) }],
  "not-found.tsx": [{ what: "an address that is no page", path: `/no-such-page-${tag}`, expect: all(404) }],
  "(app)/games/page.tsx": [
    // The list shows the team's game to its members only.
    { what: "the games", path: "/games", expect: all(200), membersSee: ["game"] },
  ],
  "(app)/games/[game]/page.tsx": [
    { what: "team A's game", path: `/games/${data.gameSlug}`, expect: membersOnly(), membersSee: ["game"] },
    { what: "the public demo game", path: "/games/vesper-circuit", expect: all(200) },
    { what: "a game that does not exist", path: `/games/no-such-game-${tag}`, expect: all(404) },
  ],
  "(app)/games/[game]/[character]/(moves)/page.tsx": [
    { what: "team A's character", path: privateCharacter, expect: membersOnly(), membersSee: ["character"] },
    { what: "a character that does not exist", path: "/games/vesper-circuit/nobody", expect: all(404) },
    {
      what: "a public character in an Edition that does not exist (rendered live, saying so)",
      path: "/games/vesper-circuit/tarrow?edition=no-such",
      expect: all(200),
    },
  ],
  // A published Edition of a public game, rendered once and served from the cache (src/server/published.ts).
  "published/[edition]/[catalog]/games/[game]/[character]/page.tsx": [
    { what: "a public character", path: "/games/vesper-circuit/tarrow", expect: all(200) },
    {
      what: "a public character in an older Edition",
      path: "/games/vesper-circuit/tarrow?edition=1-0",
      expect: all(200),
    },
    {
      what: "the demo's cached move list, at the address the proxy sends it to",
      path: demoCachedMoveList,
      expect: all(200),
    },
    {
      what: "a cached move list with a made-up Edition and signature",
      path: "/published/1/made-up-signature/games/vesper-circuit/tarrow",
      expect: all(404),
    },
    {
      what: "team A's character at a cached address, with team A's Edition and the demo's signature",
      path: async () => {
        const [edition] = await query<{ id: number }>(
          "select e.id from editions e join games g on g.id = e.game_id where g.slug = ?",
          [data.gameSlug],
        );
        const signature = (await demoCachedMoveList()).split("/")[3];
        return `/published/${edition!.id}/${signature}${privateCharacter}`;
      },
      expect: all(404),
    },
  ],
  "published/[edition]/[catalog]/games/[game]/[character]/explore/[move]/page.tsx": [
    { what: "a public move", path: demoMove, expect: all(200) },
    {
      what: "a cached copy's own address, for a move that does not exist",
      path: "/published/1/made-up/games/vesper-circuit/tarrow/explore/none",
      expect: all(404),
    },
  ],
  "published/[edition]/[catalog]/games/[game]/[character]/stances/[stance]/page.tsx": [
    { what: "a public stance sheet", path: "/games/vesper-circuit/tarrow/stances/drift", expect: all(200) },
    {
      what: "a public stance sheet, filtered, in an older Edition",
      path: "/games/vesper-circuit/tarrow/stances/drift?edition=1-0&safe=1",
      expect: all(200),
    },
  ],
  "(app)/games/[game]/[character]/explore/[move]/page.tsx": [
    {
      what: "team A's move in the Explorer",
      path: `${privateCharacter}/explore/sweep`,
      expect: membersOnly(),
      membersSee: ["character", "move"],
    },
    {
      what: "a move of team A's character that does not exist",
      path: `${privateCharacter}/explore/none`,
      expect: all(404),
    },
    // A key with a broken escape (%E0 alone): "not found", not an error page.
    { what: "a move whose address is broken", path: "/games/vesper-circuit/tarrow/explore/%25E0", expect: all(404) },
  ],
  "(app)/games/[game]/[character]/changes/page.tsx": [
    {
      // Team A's game has one Edition, a draft: its members read "nothing to compare" and the name.
      what: "what changed for team A's character",
      path: `${privateCharacter}/changes`,
      expect: membersOnly(),
      membersSee: ["character"],
    },
    { what: "what changed for a public character", path: "/games/vesper-circuit/tarrow/changes", expect: all(200) },
    {
      what: "what changed between Editions that do not exist",
      path: "/games/vesper-circuit/tarrow/changes?from=no-such&to=%25E0&page=x",
      expect: all(200),
    },
    {
      what: "what changed, with a view of the paths that cannot be read",
      path: "/games/vesper-circuit/quessaline/changes?change=all&q=%25E0&sort=damage&dir=up&page=-1&page=2",
      expect: all(200),
    },
    {
      what: "what changed, filtered and sorted past the first page",
      path: "/games/vesper-circuit/quessaline/changes?from=1-0&to=1-1&change=jails&q=4&sort=onHit&dir=desc&page=9",
      expect: all(200),
    },
    {
      what: "what changed for a character that does not exist",
      path: "/games/vesper-circuit/nobody/changes",
      expect: all(404),
    },
  ],
  "(app)/games/[game]/[character]/stances/[stance]/page.tsx": [
    {
      what: "team A's character's stance sheet",
      path: `${privateCharacter}/stances/hush`,
      expect: membersOnly(),
      membersSee: ["character", "stance"],
    },
    { what: "a stance that does not exist", path: "/games/vesper-circuit/tarrow/stances/nowhere", expect: all(404) },
    {
      what: "a stance of team A's character that does not exist",
      path: `${privateCharacter}/stances/nowhere`,
      expect: all(404),
    },
    {
      what: "a stance sheet in an Edition that does not exist",
      path: "/games/vesper-circuit/tarrow/stances/drift?edition=no-such",
      expect: all(404),
    },
  ],
  "(app)/games/[game]/[character]/import/page.tsx": [
    {
      // Coaches and owners get the import; a viewer or player of the team reads why not.
      what: "importing a file into team A's character",
      path: `${privateCharacter}/import`,
      expect: membersOnly(),
      membersSee: ["character"],
    },
    {
      what: "importing into team A's character, into an Edition that does not exist",
      path: `${privateCharacter}/import?edition=%25E0`,
      expect: membersOnly(),
    },
    // The demo game is read-only: signed in, the page says so.
    { what: "importing into a public character", path: "/games/vesper-circuit/tarrow/import", expect: signedIn },
    {
      what: "importing into a character that does not exist",
      path: "/games/vesper-circuit/nobody/import",
      expect: all(404),
    },
  ],
  "(app)/teams/page.tsx": [
    // The outsider's list has their own team only.
    { what: "my teams", path: "/teams", expect: signedIn, membersSee: ["team"] },
  ],
  "(app)/teams/[team]/page.tsx": [
    {
      what: "team A's page",
      path: `/teams/${data.teamSlug}`,
      expect: { ...membersOnly("sign-in") },
      membersSee: ["team", "owner's e-mail", "viewer's name"],
    },
    {
      what: "a team that does not exist",
      path: `/teams/no-such-team-${tag}`,
      expect: { ...all(404), anonymous: "sign-in" },
    },
  ],
  "(app)/teams/[team]/boards/[board]/page.tsx": [
    {
      // Every member reads the board (coaches and owners get its editor); anyone else gets "not found".
      what: "team A's Mix-up board",
      path: `/teams/${data.teamSlug}/boards/${data.boardId}`,
      expect: membersOnly("sign-in"),
      membersSee: ["board", "board's situation"],
    },
    {
      what: "a board number team A does not have",
      path: `/teams/${data.teamSlug}/boards/999999999`,
      expect: { ...all(404), anonymous: "sign-in" },
    },
    {
      what: "a board address that is not a number",
      path: `/teams/${data.teamSlug}/boards/x1`,
      expect: { ...all(404), anonymous: "sign-in" },
    },
  ],
  "(app)/invites/[token]/page.tsx": [
    {
      // The token is the invite's secret, mailed to the invitee, who reads it before having an account:
      // whoever holds it sees the team, who invited, and the address it went to.
      what: "team A's invite, opened with its token",
      path: `/invites/${data.inviteToken}`,
      expect: all(200),
      disclosed: ["team", "owner's name"],
    },
    {
      what: "an invite token that does not exist",
      path: `/invites/${randomBytes(32).toString("base64url")}`,
      expect: all(200),
    },
    { what: "an invite address with a broken escape", path: "/invites/%25E0%25A4%25A", expect: all(200) },
  ],
  "(auth)/sign-in/page.tsx": [{ what: "sign in", path: "/sign-in", expect: signedOut }],
  "(auth)/sign-up/page.tsx": [{ what: "sign up", path: "/sign-up", expect: signedOut }],
  "(auth)/account/page.tsx": [{ what: "my account", path: "/account", expect: signedIn }],
  "(auth)/check-email/page.tsx": [{ what: "check your e-mail", path: "/check-email?for=reset", expect: all(200) }],
  "(auth)/confirm-email/page.tsx": [
    { what: "a confirmation link that does not exist", path: `/confirm-email?token=${tag}`, expect: all(200) },
  ],
  "(auth)/forgot-password/page.tsx": [{ what: "forgot password", path: "/forgot-password", expect: all(200) }],
  "(auth)/reset-password/page.tsx": [
    { what: "a reset link that does not exist", path: `/reset-password?token=${tag}`, expect: all(200) },
  ],
  "s/[slug]/page.tsx": [
    {
      // To anyone outside team A, signed in or not, the same "not found" as a link that never was.
      what: "team A's team-only link",
      path: `/s/${data.teamOnlySlug}`,
      expect: membersOnly(),
      membersSee: ["team-only link"],
    },
    {
      what: "team A's team-only link to a board",
      path: `/s/${data.boardTeamOnlySlug}`,
      expect: membersOnly(),
      membersSee: ["board's situation"],
    },
    // A board shared with anyone shows the board (its situations) and who shared it, never the team.
    {
      what: "team A's public link to a board",
      path: `/s/${data.boardLinkSlug}`,
      expect: all(200),
      disclosed: ["player's name", "board", "board's situation"],
    },
    {
      what: "team A's team-only link to a stance sheet",
      path: `/s/${data.stanceTeamOnlySlug}`,
      expect: membersOnly(),
      membersSee: ["team-only stance link"],
    },
    // With a query (the sheet's filter), a public link is rendered live rather than from the cache.
    {
      what: "team A's public link to a stance sheet, filtered",
      path: `/s/${data.stanceLinkSlug}?safe=1`,
      expect: all(200),
      disclosed: ["player's name"],
    },
  ],
  // A link anyone may open (not a board's), rendered once and served from the cache by its slug.
  "published/links/[slug]/page.tsx": [
    // Anyone with the address may open it, by design: it shows the path and who shared it.
    { what: "team A's public link", path: `/s/${data.linkSlug}`, expect: all(200), disclosed: ["player's name"] },
    // A stance sheet shared with anyone shows the sheet and who shared it.
    {
      what: "team A's public link to a stance sheet",
      path: `/s/${data.stanceLinkSlug}`,
      expect: all(200),
      disclosed: ["player's name"],
    },
    // The cached copy's own address answers only for a link anyone may open: never a team-only one.
    {
      what: "a team-only link at the cached copy's address",
      path: `/published/links/${data.teamOnlySlug}`,
      expect: all(404),
    },
    {
      what: "a board's link at the cached copy's address",
      path: `/published/links/${data.boardLinkSlug}`,
      expect: all(404),
    },
  ],
  "s/[slug]/not-found.tsx": [
    { what: "a link that does not exist", path: `/s/${randomBytes(18).toString("base64url")}`, expect: all(404) },
  ],
  // Checked beside the pages, in its own test below: one image for every link nobody may preview.
  "s/[slug]/opengraph-image.tsx": [],
};

/** Every file under `dir`, relative to it. */
function readdirRecursive(dir: string, root = dir): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? readdirRecursive(path, root) : [relative(root, path)];
  });
}

/** Files under src/app that answer a visit: pages, not-found pages, and the metadata images and files. */
const VISITED = /^(page|not-found|opengraph-image|twitter-image|icon|apple-icon|sitemap|robots|manifest)\.(tsx?|jsx?)$/;
const visitedFiles = (dir: string) => readdirRecursive(dir).filter((f) => VISITED.test(f.split("/").pop()!));

const visitors = new Map<Visitor, APIRequestContext>();

test.describe("page inventory", () => {
  test.beforeAll(async ({ browser }, testInfo) => {
    test.skip(testInfo.project.name !== "desktop", "plain HTTP: one browser project is enough");
    testInfo.setTimeout(180_000);
    // Sign-up is rate limited per address, and every visitor comes from 127.0.0.1.
    await query("delete from rate_limits");
    visitors.set("anonymous", await request.newContext({ baseURL: testInfo.project.use.baseURL }));
    for (const v of ["outsider", ...MEMBERS] as const) {
      const context = await browser.newContext();
      const page = await context.newPage();
      await signUpAs(page, data.people[v].name, data.people[v].email);
      const state = await context.storageState();
      await context.close();
      visitors.set(v, await request.newContext({ baseURL: testInfo.project.use.baseURL, storageState: state }));
    }
    await makeTeamA();
  });

  test.afterAll(async () => {
    for (const ctx of visitors.values()) await ctx.dispose();
  });

  test("every page, not-found page and preview image under src/app has a row, and every row a file", () => {
    const found = visitedFiles(join(process.cwd(), "src/app")).sort();
    expect({
      "no row": found.filter((f) => !(f in PAGES)),
      "row for nothing": Object.keys(PAGES).filter((k) => !found.includes(k)),
    }).toEqual({ "no row": [], "row for nothing": [] });
  });

  for (const [file, targets] of Object.entries(PAGES)) {
    for (const t of targets) {
      test(`${file}: ${t.what}`, async () => {
        const got: Partial<Record<Visitor, Answer | number>> = {};
        const problems: string[] = [];
        const path = typeof t.path === "string" ? t.path : await t.path();
        for (const v of VISITORS) {
          const res = await visitors.get(v)!.get(path, { maxRedirects: 0 });
          got[v] = answerOf(res.status(), res.headers().location);
          const html = await res.text();
          if (res.status() >= 500) problems.push(`${v}: ${res.status()}`);
          for (const [name, value] of Object.entries(SECRETS) as [Secret, string][]) {
            const seen = html.includes(value);
            if (isStranger(v) && seen && !t.disclosed?.includes(name)) problems.push(`${v} read ${name}`);
            if (!isStranger(v) && got[v] === 200 && t.membersSee?.includes(name) && !seen)
              problems.push(`${v} did not see ${name}`);
          }
        }
        expect(got, path).toEqual(t.expect);
        expect(problems).toEqual([]);
      });
    }
  }

  test("an address whose escapes do not decode is not found on every dynamic page and image, and refused on every route", async () => {
    const app = join(process.cwd(), "src/app");
    const dynamic = readdirRecursive(app)
      .filter((f) => /(^|\/)(page|route|opengraph-image)\.tsx?$/.test(f) && f.includes("["))
      .map((f) => ({
        route: /(^|\/)route\.tsx?$/.test(f),
        path: `/${f}`
          .replace(/\/\([^)]*\)/g, "")
          .replace(/\/(page|route)\.tsx?$/, "")
          .replace(/\.tsx?$/, "")
          .replace(/\[[^\]]+\]/, "%E0")
          .replace(/\[[^\]]+\]/g, "x"),
      }));
    expect(dynamic.length).toBeGreaterThan(5);
    const got = Object.fromEntries(
      await Promise.all(dynamic.map(async ({ path }) => [path, (await visitors.get("anonymous")!.get(path)).status()])),
    );
    // A route answers our JSON 400 (src/proxy.ts), a page or image our 404.
    expect(got).toEqual(Object.fromEntries(dynamic.map(({ path, route }) => [path, route ? 400 : 404])));
  });

  test("s/[slug]/opengraph-image.tsx: a link nobody may preview gets the one plain card, whoever asks", async () => {
    const imageOf = async (v: Visitor, slug: string) => {
      const res = await visitors.get(v)!.get(`/s/${slug}/opengraph-image`);
      expect(res.status(), `${v}, ${slug}`).toBe(200);
      expect(res.headers()["content-type"]).toBe("image/png");
      return createHash("sha256")
        .update(await res.body())
        .digest("hex");
    };
    const plain = await imageOf("anonymous", randomBytes(18).toString("base64url"));
    for (const v of VISITORS) {
      // Team-only: the same bytes as a link that does not exist, even for the team's own members
      // (previews are fetched without a session). A public link's preview shows its path.
      expect(await imageOf(v, data.teamOnlySlug), `${v}: team-only link`).toBe(plain);
      expect(await imageOf(v, data.linkSlug), `${v}: public link`).not.toBe(plain);
      expect(await imageOf(v, data.stanceTeamOnlySlug), `${v}: team-only stance link`).toBe(plain);
      expect(await imageOf(v, data.stanceLinkSlug), `${v}: public stance link`).not.toBe(plain);
    }
  });
});

/** A redirect by where it goes; anything else by its status. */
function answerOf(status: number, location: string | undefined): Answer | number {
  if (status >= 300 && status < 400 && location) {
    const to = new URL(location, "http://app.invalid");
    if (to.pathname === "/sign-in") return "sign-in";
    if (to.pathname === "/") return "home";
  }
  return status;
}

/** Team A, straight into the database: its members (signed up above), a game of its own, two links, an invite. */
async function makeTeamA() {
  const id = async (email: string) =>
    (await query<{ id: string }>("select id from users where email = ?", [email]))[0]!.id;
  const ids = Object.fromEntries(
    await Promise.all((["outsider", ...MEMBERS] as const).map(async (v) => [v, await id(data.people[v].email)])),
  ) as Record<keyof typeof data.people, string>;

  await query("insert into teams (slug, name) values (?, ?)", [data.teamSlug, data.teamName]);
  const [team] = await query<{ id: number }>("select id from teams where slug = ?", [data.teamSlug]);
  for (const role of MEMBERS)
    await query("insert into memberships (team_id, user_id, role) values (?, ?, ?)", [team!.id, ids[role], role]);
  await query("insert into teams (slug, name) values (?, ?)", [`elsewhere-${tag}`, `Elsewhere ${tag}`]);
  const [other] = await query<{ id: number }>("select id from teams where slug = ?", [`elsewhere-${tag}`]);
  await query("insert into memberships (team_id, user_id, role) values (?, ?, 'owner')", [other!.id, ids.outsider]);

  await query("insert into games (slug, name, team_id) values (?, ?, ?)", [data.gameSlug, data.gameName, team!.id]);
  const [game] = await query<{ id: number }>("select id from games where slug = ?", [data.gameSlug]);
  await query("insert into editions (game_id, slug, name, released_on) values (?, '0-1', '0.1', '2026-10-01')", [
    game!.id,
  ]);
  const [edition] = await query<{ id: number }>("select id from editions where game_id = ?", [game!.id]);
  await query("insert into characters (game_id, slug, name) values (?, 'hidden-lantern', ?)", [
    game!.id,
    data.characterName,
  ]);
  const [character] = await query<{ id: number }>("select id from characters where game_id = ?", [game!.id]);
  await query(
    `insert into moves (edition_id, character_id, \`key\`, input, name, level, damage, startup, on_block, on_hit, on_counter_hit, tags)
     values (?, ?, 'sweep', 'sweep', ?, 'low', 12, 14, '-13', '3', '5', '[]')`,
    [edition!.id, character!.id, data.moveName],
  );

  await query(
    "insert into stances (edition_id, character_id, `key`, name, abbreviation) values (?, ?, 'hush', ?, 'HSH')",
    [edition!.id, character!.id, data.stanceName],
  );

  // Two links of the player's on the public demo character: one for the team, one for anyone.
  const [tarrow] = await query<{ id: number; editionId: number }>(
    `select c.id, e.id as editionId from characters c join games g on g.id = c.game_id
     join editions e on e.game_id = g.id where g.slug = 'vesper-circuit' and c.slug = 'tarrow' and e.slug = '1-1'`,
  );
  const view = JSON.stringify({
    root: "v",
    path: null,
    options: { maxDepth: 8, maxStanceVisits: 1, fastest: 10 },
    opponent: null,
  });
  for (const [slug, visibility, title] of [
    [data.teamOnlySlug, "team", data.teamOnlyTitle],
    [data.linkSlug, "link", data.linkTitle],
  ])
    await query(
      `insert into permalinks (slug, team_id, created_by, visibility, edition_id, character_id, view, title)
       values (?, ?, ?, ?, ?, ?, ?, ?)`,
      [slug, team!.id, ids.player, visibility, tarrow!.editionId, tarrow!.id, view, title],
    );

  // A board of the team's on the demo character, and two links to it.
  const document = JSON.stringify({
    root: "s1",
    values: {
      plusFrame: 1,
      minusFrame: 1,
      states: { knockdown: 10, launch: 35, "wall-splat": 25, crumple: 30, throw: 0 },
      whiff: 20,
    },
    situations: [
      {
        id: "s1",
        name: data.boardSituation,
        note: "",
        rows: ["Go on", "Stop"],
        cols: ["Stand guard", "Crouch guard"],
        cells: [
          [
            { basis: null, override: 10, next: null },
            { basis: null, override: -5, next: null },
          ],
          [
            { basis: null, override: -2, next: null },
            { basis: null, override: 0, next: null },
          ],
        ],
      },
    ],
  });
  await query(
    `insert into boards (id, team_id, edition_id, character_id, title, document, created_by, updated_by)
     values (?, ?, ?, ?, ?, ?, ?, ?)`,
    [data.boardId, team!.id, tarrow!.editionId, tarrow!.id, data.boardTitle, document, ids.coach, ids.coach],
  );
  for (const [slug, visibility] of [
    [data.boardTeamOnlySlug, "team"],
    [data.boardLinkSlug, "link"],
  ])
    await query(
      `insert into permalinks (slug, team_id, created_by, kind, visibility, edition_id, character_id, view, title)
       values (?, ?, ?, 'board', ?, ?, ?, ?, ?)`,
      [
        slug,
        team!.id,
        ids.player,
        visibility,
        tarrow!.editionId,
        tarrow!.id,
        JSON.stringify({ board: data.boardId }),
        data.boardTitle,
      ],
    );

  for (const [slug, visibility, title] of [
    [data.stanceTeamOnlySlug, "team", data.stanceTeamOnlyTitle],
    [data.stanceLinkSlug, "link", "Stance: Drift · Tarrow · edition 1-1"],
  ])
    await query(
      `insert into permalinks (slug, team_id, created_by, kind, visibility, edition_id, character_id, view, title)
       values (?, ?, ?, 'stance', ?, ?, ?, ?, ?)`,
      [
        slug,
        team!.id,
        ids.player,
        visibility,
        tarrow!.editionId,
        tarrow!.id,
        JSON.stringify({ stance: "drift" }),
        title,
      ],
    );

  await query(
    `insert into invites (team_id, email, role, token_hash, invited_by, expires_at)
     values (?, ?, 'player', ?, ?, date_add(utc_timestamp(), interval 7 day))`,
    [team!.id, data.inviteEmail, createHash("sha256").update(data.inviteToken).digest("hex"), ids.owner],
  );
}
