import { afterAll, expect, test, vi } from "vitest";
import { GET as graph } from "@/app/api/characters/[id]/graph/route";
import { closeDb } from "@/server/db";
import { setSession } from "./session-mock";
import { world } from "./world";

vi.mock("@/server/auth", () => import("./session-mock"));
afterAll(closeDb);

/** Status, caching headers and body of GET /api/characters/[id]/graph, with the id itself written as <id>. */
async function answer(id: number, headers: Record<string, string> = {}) {
  const res = await graph(new Request(`http://test/api/characters/${id}/graph`, { headers }), {
    params: Promise.resolve({ id: String(id) }),
  });
  const cachedAs = ["etag", "cache-control", "vary"].map((h) => res.headers.get(h));
  return { status: res.status, cachedAs, body: (await res.text()).replaceAll(String(id), "<id>") };
}

test("a team's private character answers a stranger, signed in or not, exactly what an unknown id gets", async () => {
  const w = await world();
  const unknown = await answer(w.teamCharacterId + 1_000_000);
  expect(unknown.status).toBe(404);

  setSession(null);
  expect(await answer(w.teamCharacterId)).toEqual(unknown);
  const outsider = w.people.outsider;
  setSession({ id: outsider.id, email: outsider.email, name: outsider.name });
  expect(await answer(w.teamCharacterId)).toEqual(unknown);

  // Its members read it.
  const viewer = w.people.viewer;
  setSession({ id: viewer.id, email: viewer.email, name: viewer.name });
  const member = await answer(w.teamCharacterId);
  expect(member.status).toBe(200);

  // After a member's answer, and sent that answer's ETag, a stranger still learns nothing.
  const etag = member.cachedAs[0];
  expect(etag).toMatch(/^".+"$/);
  for (const stranger of [null, { id: outsider.id, email: outsider.email, name: outsider.name }]) {
    setSession(stranger);
    expect(await answer(w.teamCharacterId)).toEqual(unknown);
    expect(await answer(w.teamCharacterId, { "if-none-match": etag! })).toEqual(unknown);
  }
});
