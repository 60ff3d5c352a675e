import { afterAll, expect, test, vi } from "vitest";
import { GET as graph } from "@/app/api/characters/[id]/graph/route";
import { closeDb } from "@/server/db";
import { setSession } from "./session-mock";
import { world } from "./world";

vi.mock("@/server/auth", () => import("./session-mock"));
afterAll(closeDb);

/** Status and body of GET /api/characters/[id]/graph, with the id itself written as <id>. */
async function answer(id: number) {
  const res = await graph(new Request(`http://test/api/characters/${id}/graph`), {
    params: Promise.resolve({ id: String(id) }),
  });
  return { status: res.status, body: (await res.text()).replaceAll(String(id), "<id>") };
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
  expect((await answer(w.teamCharacterId)).status).toBe(200);
});
