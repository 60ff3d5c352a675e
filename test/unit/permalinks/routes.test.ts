import { afterAll, beforeAll, describe, expect, test, vi } from "vitest";
import { DELETE as revoke } from "@/app/api/permalinks/[slug]/route";
import { POST as create } from "@/app/api/permalinks/route";
import { closeDb } from "@/server/db";
import { listTeamPermalinks } from "@/server/db/queries/permalinks";
import { setSession } from "../authz/session-mock";
import { makePeople, stringView, tarrow } from "./fixtures";

// The route handlers read the session through @/server/auth, as every route does.
vi.mock("@/server/auth", () => import("../authz/session-mock"));

const people = makePeople();
let player: string, viewer: string, outsider: string, team: number, characterId: number;
beforeAll(async () => {
  player = await people.user("Player Fay");
  viewer = await people.user("Viewer Gil");
  outsider = await people.user("Outsider Hal");
  team = await people.team({ [player]: "player", [viewer]: "viewer" });
  characterId = (await tarrow()).character.id;
});
afterAll(async () => {
  await people.cleanup();
  await closeDb();
});

/** Signs `id` in (the fixtures give each user the address `<id>@example.test`), or signs out. */
const signIn = (id: string | null) => setSession(id === null ? null : { id, email: `${id}@example.test`, name: null });
const post = (userId: string | null, body: unknown) => {
  signIn(userId);
  return create(
    new Request("http://localhost/api/permalinks", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(body),
    }),
  );
};
const del = (userId: string | null, slug: string) => {
  signIn(userId);
  return revoke(new Request(`http://localhost/api/permalinks/${slug}`, { method: "DELETE" }), {
    params: Promise.resolve({ slug }),
  });
};
const body = () => ({ teamId: team, characterId, edition: "1-1", view: stringView(), visibility: "link" });
const errorOf = async (res: Response) => ((await res.json()) as { error: { message: string } }).error.message;

describe("POST /api/permalinks", () => {
  test("a player shares: 201 with the link", async () => {
    const res = await post(player, body());
    expect(res.status).toBe(201);
    const { permalink } = (await res.json()) as { permalink: { path: string; title: string } };
    expect(permalink.path).toMatch(/^\/s\/[A-Za-z0-9_-]{24}$/);
    expect(permalink.title).toBe("Tarrow · v.v.t · edition 1-1");
  });

  test("a bad body is 400 before anything else; signed out is 401; a viewer 403; an outsider 404", async () => {
    const bad = await post(null, { ...body(), visibility: "everyone" });
    expect(bad.status).toBe(400);
    expect(await errorOf(bad)).toMatch(/visibility/);
    const signedOut = await post(null, body());
    expect(signedOut.status).toBe(401);
    expect(await errorOf(signedOut)).toBe("Sign in to do this.");
    const viewing = await post(viewer, body());
    expect(viewing.status).toBe(403);
    expect(await errorOf(viewing)).toMatch(/player role or higher/);
    expect((await post(outsider, body())).status).toBe(404);
  });

  test("an unknown root is a 400 that names it, never a 500", async () => {
    const res = await post(player, { ...body(), view: stringView({ root: "9,9,9", path: null }) });
    expect(res.status).toBe(400);
    expect(await errorOf(res)).toMatch(/no move "9,9,9"/);
  });
});

describe("revoking and listing", () => {
  test("the creator revokes through DELETE; a malformed slug is 400; the team's list shows it revoked", async () => {
    const made = (await (await post(player, body())).json()) as { permalink: { slug: string } };
    const { slug } = made.permalink;
    expect((await del(player, "x")).status).toBe(400);
    expect((await del(null, slug)).status).toBe(401);
    const res = await del(player, slug);
    expect(res.status).toBe(200);
    expect(((await res.json()) as { permalink: { revokedAt: string | null } }).permalink.revokedAt).not.toBeNull();

    // Who may read the list is the role matrix's business (test/unit/authz).
    const permalinks = await listTeamPermalinks({ teamId: team });
    expect(permalinks.find((p) => p.slug === slug)?.revoked).toBe(true);
  });
});
