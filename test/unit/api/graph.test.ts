import { createHash } from "node:crypto";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import { GET } from "@/app/api/characters/[id]/graph/route";
import { explorePaths, graphSchema, type MoveGraph } from "@/lib/engine";
import type { SessionUser } from "@/server/auth";
import { closeDb } from "@/server/db";
import { addMove } from "@/server/db/queries/character-edits";
import { getExplorerData } from "@/server/db/queries/explorer";
import { gameEdition, getCharacterById, getCharacterBySlug, getGameBySlug } from "@/server/db/queries/games";
import { DEMO_GAME } from "@/server/db/seed/demo";
import { forgetGraphBodies, GRAPH_CACHE, publishedGraphBody } from "@/server/graph-bodies";
import { forgetCatalogs, forgetPublicCharacters, publicCharacter } from "@/server/published";
import { setSession } from "../authz/session-mock";
import { draftOf, world, type World } from "../authz/world";

// Reads the seeded test database that `npm test` prepares. The session is set by the test
// (team games); the two reads a request may make are counted, to see what the cache saves.
vi.mock("@/server/auth", () => import("../authz/session-mock"));
vi.mock("@/server/db/queries/explorer", async (original) => {
  const real = await original<typeof import("@/server/db/queries/explorer")>();
  return { ...real, getExplorerData: vi.fn(real.getExplorerData) };
});
vi.mock("@/server/db/queries/games", async (original) => {
  const real = await original<typeof import("@/server/db/queries/games")>();
  return { ...real, getCharacterById: vi.fn(real.getCharacterById) };
});
afterAll(closeDb);
beforeEach(() => {
  setSession(null);
  forgetGraphBodies();
  forgetPublicCharacters();
  forgetCatalogs();
  vi.mocked(getExplorerData).mockClear();
  vi.mocked(getCharacterById).mockClear();
});

async function tarrowId() {
  const game = await getGameBySlug({ slug: "vesper-circuit" });
  const c = game && (await getCharacterBySlug({ gameId: game.id, slug: "tarrow" }));
  if (!c) throw new Error("demo data missing");
  return c.id;
}

const get = (id: string | number, query = "", headers: Record<string, string> = {}) =>
  GET(new Request(`http://test/api/characters/${id}/graph${query}`, { headers }), {
    params: Promise.resolve({ id: String(id) }),
  });

const caching = (res: Response) => ({
  status: res.status,
  etag: res.headers.get("etag"),
  cacheControl: res.headers.get("cache-control"),
  vary: res.headers.get("vary"),
});

const as = (w: World, who: keyof World["people"]): SessionUser => ({
  id: w.people[who].id,
  email: w.people[who].email,
  name: w.people[who].name,
});

describe("GET /api/characters/[id]/graph", () => {
  test("returns the newest Edition's graph in the engine's shape, ready to explore", async () => {
    const res = await get(await tarrowId());
    expect(res.status).toBe(200);
    const body = (await res.json()) as {
      edition: { slug: string };
      graph: MoveGraph;
      roots: string[];
      game: { fastest: number };
    };
    expect(body.edition.slug).toBe("1-1");
    expect(body.game.fastest).toBe(DEMO_GAME.fastest);
    expect(graphSchema.safeParse(body.graph).success).toBe(true);
    expect(body.roots).toContain("n");
    expect(body.roots).not.toContain("n.v");

    // v.v.t cancelled into Ember Guard: -14 → -3 in 1.1, 11 frames saved.
    const cancelled = explorePaths(body.graph, "v").find((p) => p.input === "v.v.t~press");
    expect(cancelled).toMatchObject({ endsIn: "stance", onBlock: -3, framesSaved: 11, blockClass: "safe" });
  });

  test("an older Edition by slug has its own numbers", async () => {
    const res = await get(await tarrowId(), "?edition=1-0");
    const body = (await res.json()) as { graph: MoveGraph };
    const cancelled = explorePaths(body.graph, "v").find((p) => p.input === "v.v.t~press");
    expect(cancelled?.onBlock).toBe(-4);
  });

  test("bad ids and unknown Editions are 400 and 404 with a message, never 500", async () => {
    const id = await tarrowId();
    const bad = await get("abc");
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { error: { message: string } }).error.message).toMatch(/positive whole number/);
    expect((await get(id, "?edition=<script>")).status).toBe(400);
    expect((await get(id, "?edition=9-9")).status).toBe(404);
    expect((await get(987_654_321)).status).toBe(404);
  });
});

// HTTP caching (RFC 9110 §8.8.3 ETag, §13.1.2 If-None-Match, §15.4.5 304; RFC 9111 §5.2.2
// Cache-Control; RFC 5861 stale-while-revalidate).
describe("GET /api/characters/[id]/graph: caching", () => {
  test("a public published Edition carries a strong ETag of its bytes and public caching; a matching If-None-Match is 304 with no body", async () => {
    const id = await tarrowId();
    const res = await get(id, "?edition=1-1");
    const text = await res.text();
    // A strong validator that changes with the bytes: the body's SHA-256 (RFC 9110 §8.8.1).
    const etag = `"${createHash("sha256").update(text).digest("base64url")}"`;
    const answered = (status: number) => ({ status, etag, cacheControl: GRAPH_CACHE.publicEdition, vary: null });
    expect(caching(res)).toEqual(answered(200));
    expect(GRAPH_CACHE.publicEdition).toMatch(/^public, max-age=\d+/);
    expect(res.headers.get("content-type")).toMatch(/^application\/json/);

    // "*", the tag itself, weakly, or within a list (RFC 9110 §13.1.2: weak comparison).
    for (const ifNoneMatch of [etag, `W/${etag}`, `"other", ${etag}`, `  ${etag} ,"x"`, "*"]) {
      const again = await get(id, "?edition=1-1", { "if-none-match": ifNoneMatch });
      expect(caching(again), ifNoneMatch).toEqual(answered(304));
      expect(await again.text()).toBe("");
    }
    // Another tag, or a header that is not a list of tags: the whole answer.
    const garbled = [`"other"`, etag.slice(1, -1), `${etag.slice(0, -2)}"`, `"${etag}"`, `${etag} junk`, "W/", ","];
    for (const ifNoneMatch of garbled) {
      const full = await get(id, "?edition=1-1", { "if-none-match": ifNoneMatch });
      expect(caching(full), ifNoneMatch).toEqual(answered(200));
      expect(await full.text()).toBe(text);
    }
  });

  test("without ?edition= (the newest, which the next Edition replaces) public caching is short", async () => {
    const res = await get(await tarrowId());
    expect(caching(res)).toMatchObject({ status: 200, cacheControl: GRAPH_CACHE.publicNewest, vary: null });
    const seconds = (value: string) => Number(/max-age=(\d+)/.exec(value)?.[1]);
    expect(seconds(GRAPH_CACHE.publicNewest)).toBeLessThan(seconds(GRAPH_CACHE.publicEdition));
  });

  test("a repeat request for a public published Edition reads nothing and sends the same bytes, those of getExplorerData", async () => {
    const id = await tarrowId();
    const first = await (await get(id, "?edition=1-0")).text();
    expect(vi.mocked(getExplorerData)).toHaveBeenCalledTimes(1);
    vi.mocked(getExplorerData).mockClear();
    vi.mocked(getCharacterById).mockClear();

    const second = await get(id, "?edition=1-0");
    expect(await second.text()).toBe(first);
    expect(vi.mocked(getExplorerData), "the body is kept").not.toHaveBeenCalled();
    expect(vi.mocked(getCharacterById), "the character is known to be public").not.toHaveBeenCalled();

    const fresh = await getExplorerData({ characterId: id, edition: "1-0" });
    expect(fresh.ok && JSON.stringify(fresh.data)).toBe(first);
    // Another Edition of the same character is another body.
    expect(await (await get(id, "?edition=1-1")).text()).not.toBe(first);
  });

  test("a kept body is keyed by the game's catalog signature (a newly published Edition makes a new key); a draft's is never kept", async () => {
    const tarrow = await getCharacterById({ id: await tarrowId() });
    const known = await publicCharacter(tarrow!.character.id, tarrow!.game.slug);
    if (!known) throw new Error("the demo game is public");
    vi.mocked(getExplorerData).mockClear();
    const first = await publishedGraphBody(known, "1-1");
    expect(await publishedGraphBody(known, "1-1")).toBe(first);
    expect(vi.mocked(getExplorerData)).toHaveBeenCalledTimes(1);

    const republished = { ...known, catalog: { ...known.catalog, signature: "another-catalog" } };
    expect(await publishedGraphBody(republished, "1-1")).toEqual(first);
    expect(vi.mocked(getExplorerData), "a new signature is a new key").toHaveBeenCalledTimes(2);

    // Were an Edition of a public game a draft, it would be answered live, never kept.
    const asDraft = {
      ...known,
      catalog: { ...known.catalog, editions: known.catalog.editions.map((e) => ({ ...e, status: "draft" as const })) },
    };
    expect(await publishedGraphBody(asDraft, "1-1")).toBeNull();
    expect(await publishedGraphBody(known, "9-9")).toBeNull();
    expect(vi.mocked(getExplorerData)).toHaveBeenCalledTimes(2);
  });

  test("a team's published Edition: private, checked on each use, Vary: Cookie; a stranger with a member's ETag gets the unknown id's 404", async () => {
    const w = await world();
    const unknown = await get(w.teamCharacterId + 1_000_000, "?edition=0-1");
    const unknownText = (await unknown.text()).replaceAll(String(w.teamCharacterId + 1_000_000), "<id>");

    setSession(as(w, "viewer"));
    const member = await get(w.teamCharacterId, "?edition=0-1");
    const etag = member.headers.get("etag");
    expect(caching(member)).toEqual({ status: 200, etag, cacheControl: GRAPH_CACHE.teamPublished, vary: "Cookie" });
    expect(GRAPH_CACHE.teamPublished).toMatch(/^private\b/);
    expect(etag).toMatch(/^"[\w-]{43}"$/);
    expect(caching(await get(w.teamCharacterId, "?edition=0-1", { "if-none-match": etag! }))).toEqual({
      status: 304,
      etag,
      cacheControl: GRAPH_CACHE.teamPublished,
      vary: "Cookie",
    });

    for (const stranger of [null, as(w, "outsider")]) {
      setSession(stranger);
      const sent: Record<string, string>[] = [{}, { "if-none-match": etag! }, { "if-none-match": "*" }];
      for (const headers of sent) {
        const res = await get(w.teamCharacterId, "?edition=0-1", headers);
        expect(caching(res)).toEqual(caching(unknown));
        expect((await res.text()).replaceAll(String(w.teamCharacterId), "<id>")).toBe(unknownText);
      }
    }
    expect(unknown.status).toBe(404);
  });

  test("a draft is never stored anywhere: private, no-store, and an edit shows in the next answer", async () => {
    const w = await world();
    const slug = await draftOf(w);
    setSession(as(w, "coach"));
    const before = await get(w.teamCharacterId, `?edition=${slug}`);
    const beforeBody = (await before.json()) as { graph: MoveGraph; edition: { status: string } };
    expect(beforeBody.edition.status).toBe("draft");
    expect(caching(before)).toMatchObject({ status: 200, cacheControl: GRAPH_CACHE.draft, vary: "Cookie" });
    expect(GRAPH_CACHE.draft).toBe("private, no-store");
    expect(beforeBody.graph.nodes.some((n) => n.id === "3")).toBe(false);

    const draft = await gameEdition({ game: { id: w.teamGame.id, name: "Team Game" }, slug });
    await addMove(
      {
        teamId: w.team.id,
        gameId: w.teamGame.id,
        editionId: draft.id,
        characterId: w.teamCharacterId,
        actorId: w.people.coach.id,
      },
      {
        op: "add-move",
        move: { input: "3", name: "Late Poke", level: "mid", damage: 9, onBlock: -3, onHit: 2, onCounterHit: 4 },
      },
    );
    // Even sent the old ETag, the edited draft comes back whole, with a new one.
    const after = await get(w.teamCharacterId, `?edition=${slug}`, { "if-none-match": before.headers.get("etag")! });
    expect(after.status).toBe(200);
    expect(after.headers.get("etag")).not.toBe(before.headers.get("etag"));
    expect(after.headers.get("cache-control")).toBe("private, no-store");
    const afterBody = (await after.json()) as { graph: MoveGraph };
    expect(afterBody.graph.nodes.some((n) => n.id === "3")).toBe(true);
  });
});
