import { randomBytes } from "node:crypto";
import { afterAll, describe, expect, test } from "vitest";
import { POST } from "@/app/api/paths/route";
import { MAX_BODY_BYTES } from "@/app/api/paths/schema";
import { LIMITS } from "@/server/auth/rate-limit";
import { closeDb } from "@/server/db";

afterAll(closeDb);

/** An address of the documentation range no other run has used, so the route's per-address budget starts full. */
const freshAddress = () => `2001:db8::${randomBytes(6).toString("hex").match(/..../g)!.join(":")}`;

const move = (id: string, input: string, onBlock: number) => ({
  id,
  kind: "move",
  input,
  level: "mid",
  damage: 10,
  startup: id === "a" ? 12 : undefined,
  onBlock,
  onHit: 3,
  onCounterHit: 5,
});

const graph = {
  nodes: [move("a", "1", -2), move("b", "1,2", -8), { id: "s", kind: "stance", name: "Lean" }],
  edges: [
    {
      id: "ab",
      kind: "follow",
      from: "a",
      to: "b",
      input: ",2",
      gapOnBlock: 2,
      comboOnHit: true,
      comboOnCounterHit: true,
    },
    {
      id: "bs",
      kind: "cancel",
      from: "b",
      to: "s",
      input: "~b",
      onBlock: 1,
      onHit: 4,
      onCounterHit: 4,
      autoGuard: ["high"],
    },
  ],
};

function post(body: unknown, init: { type?: string; raw?: string; from?: string } = {}) {
  return POST(
    new Request("http://test/api/paths", {
      method: "POST",
      headers: { "content-type": init.type ?? "application/json", "x-forwarded-for": init.from ?? freshAddress() },
      body: init.raw ?? JSON.stringify(body),
    }),
  );
}

describe("POST /api/paths", () => {
  test("returns every path from the root with the engine's fields", async () => {
    const res = await post({ graph, root: "a" });
    expect(res.status).toBe(200);
    const body = (await res.json()) as {
      paths: { input: string; framesSaved: number | null; endsIn: string }[];
      truncated: boolean;
    };
    expect(body.truncated).toBe(false);
    expect(body.paths.map((p) => p.input).sort()).toEqual(["1", "1,2", "1,2~b"]);
    expect(body.paths.find((p) => p.endsIn === "stance")?.framesSaved).toBe(9);
  });

  test("cuts at the limit and says so", async () => {
    const res = await post({ graph, root: "a", limit: 2 });
    const body = (await res.json()) as { paths: unknown[]; truncated: boolean };
    expect(body.paths).toHaveLength(2);
    expect(body.truncated).toBe(true);
  });

  test("a graph with an edge to a missing node is refused with 400 naming the edge", async () => {
    const bad = { ...graph, edges: [...graph.edges, { ...graph.edges[0], id: "ax", to: "nowhere" }] };
    const res = await post({ graph: bad, root: "a" });
    expect(res.status).toBe(400);
    const body = (await res.json()) as { error: { code: string; message: string; issues: { message: string }[] } };
    expect(body.error.code).toBe("bad_request");
    expect(body.error.issues.map((i) => i.message).join("\n")).toMatch(/"ax"[\s\S]*"nowhere"/);
  });

  test("a root that is not in the graph is a 400, not a 500", async () => {
    const res = await post({ graph, root: "zz" });
    expect(res.status).toBe(400);
    expect(((await res.json()) as { error: { message: string } }).error.message).toMatch(/zz/);
  });

  test("malformed JSON, wrong types, unknown fields and non-JSON bodies are refused", async () => {
    expect((await post(null, { raw: "{ not json" })).status).toBe(400);
    expect((await post({ graph: "nodes", root: 3 })).status).toBe(400);
    expect((await post({ graph, root: "a", extra: true })).status).toBe(400);
    expect((await post({ graph, root: "a", options: { maxDepth: -1 } })).status).toBe(400);
    expect((await post(null, { type: "text/plain", raw: "hello" })).status).toBe(415);
  });

  test("a body over the size limit is refused with 413", async () => {
    const huge = JSON.stringify({ graph, root: "a", padding: "x".repeat(MAX_BODY_BYTES) });
    const res = await post(null, { raw: huge });
    expect(res.status).toBe(413);
  });

  test("one address past its budget gets 429 in the JSON error format, with Retry-After", async () => {
    const from = freshAddress();
    for (let i = 0; i < LIMITS.pathsIpMinute.points; i++)
      expect((await post({ graph, root: "a" }, { from })).status).toBe(200);
    const res = await post({ graph, root: "a" }, { from });
    expect(res.status).toBe(429);
    const body = (await res.json()) as { error: { code: string; message: string } };
    expect(body.error).toEqual({ code: "rate_limited", message: "Too many attempts, try again in 1 minute." });
    expect(Number(res.headers.get("retry-after"))).toBeGreaterThanOrEqual(1);
    expect(Number(res.headers.get("retry-after"))).toBeLessThanOrEqual(LIMITS.pathsIpMinute.duration);
    // Refused before the body is read: even a body that is not JSON gets the 429.
    expect((await post(null, { from, type: "text/plain", raw: "hello" })).status).toBe(429);
    // Another address is not affected.
    expect((await post({ graph, root: "a" })).status).toBe(200);
  });
});
