import { describe, expect, test } from "vitest";
import { exploreRequestSchema, optionsSchema, parseGraph, type MoveGraph } from "../../../src/lib/engine";
import { cancel, enter, follow, move, sampleGraph, stance } from "./fixtures";

function messages(input: unknown): string[] {
  const r = parseGraph(input);
  return r.success ? [] : r.error.issues.map((i) => i.message);
}

function withEdge(edge: MoveGraph["edges"][number]): MoveGraph {
  const g = sampleGraph();
  g.edges.push(edge);
  return g;
}

describe("graphSchema", () => {
  test("accepts the sample graph and keeps its data", () => {
    const r = parseGraph(sampleGraph());
    expect(r.success).toBe(true);
    expect(r.data).toEqual(sampleGraph());
  });

  test.each([
    ["an edge to a missing node", withEdge(follow("e9", "a", "nowhere", ",1")), ["e9", "nowhere"]],
    ["a cancel into a move", withEdge(cancel("c9", "a", "b", "~f", { onBlock: 0, onHit: 0 })), ["c9", "b"]],
    ["a follow into a stance", withEdge(follow("f9", "a", "s", ",1")), ["f9", "s"]],
    ["an enter from a move", withEdge(enter("n9", "a", "e", "2")), ["n9", "a"]],
    ["a follow from a stance", withEdge(follow("f8", "s", "e", "2")), ["f8", "s"]],
    ["a duplicate edge id", withEdge(follow("f1", "a", "c", ",4")), ["f1"]],
  ])("rejects %s, naming the ids", (_, graph, ids) => {
    const found = messages(graph);
    expect(found).toHaveLength(1);
    for (const id of ids) expect(found[0]).toContain(`"${id}"`);
  });

  test("rejects a negative startup, naming the move", () => {
    const g = sampleGraph();
    g.nodes.push(move("neg", "3", "mid", { startup: -1 }));
    expect(messages(g)).toEqual([expect.stringContaining('"neg"')]);
    expect(messages(g)[0]).toMatch(/startup/);
  });

  test("rejects a duplicate node id and negative damage", () => {
    const g = sampleGraph();
    g.nodes.push(stance("a"), move("hurt", "3", "mid", { damage: -5 }));
    const found = messages(g);
    expect(found.some((m) => m.includes('duplicate node id "a"'))).toBe(true);
    expect(found.some((m) => m.includes('"hurt"') && m.includes("damage"))).toBe(true);
  });

  test("rejects malformed fields and unknown kinds", () => {
    expect(parseGraph({ nodes: [{ id: "x", kind: "move" }], edges: [] }).success).toBe(false);
    expect(parseGraph({ nodes: [{ id: "x", kind: "pose", name: "p" }], edges: [] }).success).toBe(false);
    const g = sampleGraph();
    (g.nodes[0] as { onBlock: unknown }).onBlock = { state: "dizzy" };
    expect(parseGraph(g).success).toBe(false);
    const h = sampleGraph();
    (h.nodes[0] as { onBlock: unknown }).onBlock = 1.5;
    expect(parseGraph(h).success).toBe(false);
  });
});

describe("optionsSchema", () => {
  test("fills the defaults", () => {
    expect(optionsSchema.parse({})).toEqual({ maxDepth: 8, maxStanceVisits: 1, fastest: 10, launchAt: 15 });
  });

  test("refuses out-of-range bounds", () => {
    expect(optionsSchema.safeParse({ maxDepth: 0 }).success).toBe(false);
    expect(optionsSchema.safeParse({ maxDepth: 65 }).success).toBe(false);
    expect(optionsSchema.safeParse({ maxStanceVisits: -1 }).success).toBe(false);
    expect(optionsSchema.safeParse({ fastest: 16 }).success).toBe(false);
  });

  test("a request bundles graph, root, options and limit", () => {
    const r = exploreRequestSchema.safeParse({ graph: sampleGraph(), rootId: "a", limit: 100 });
    expect(r.success).toBe(true);
    expect(exploreRequestSchema.safeParse({ graph: sampleGraph(), rootId: "a", limit: 0 }).success).toBe(false);
  });
});
