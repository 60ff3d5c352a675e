import { fc, test } from "@fast-check/vitest";
import dagre from "@dagrejs/dagre";
import { describe, expect } from "vitest";
import { layoutGraph, type LayoutEdge, type LayoutNode, type LayoutOptions } from "@/lib/layout-graph";

const graphArb = fc
  .integer({ min: 1, max: 40 })
  .chain((n) =>
    fc.record({
      nodes: fc.tuple(
        ...Array.from({ length: n }, (_, i) =>
          fc.record({
            id: fc.constant(`n${i}`),
            width: fc.integer({ min: 40, max: 220 }),
            height: fc.integer({ min: 20, max: 90 }),
          }),
        ),
      ),
      edges: fc.array(fc.tuple(fc.nat(n - 1), fc.nat(n - 1)), { maxLength: n * 2 }),
    }),
  )
  .map(({ nodes, edges }) => ({
    nodes: nodes as LayoutNode[],
    edges: edges.map(([a, b], i): LayoutEdge => ({ id: `e${i}`, source: `n${a}`, target: `n${b}` })),
  }));

/** Can `to` be reached from `from` along the edges? */
function reaches(edges: LayoutEdge[], from: string, to: string): boolean {
  const seen = new Set([from]);
  const stack = [from];
  while (stack.length) {
    const v = stack.pop()!;
    if (v === to) return true;
    for (const e of edges) if (e.source === v && !seen.has(e.target)) (seen.add(e.target), stack.push(e.target));
  }
  return false;
}

const effortArb = fc.constantFrom<NonNullable<LayoutOptions["effort"]>>("minimise", "fast");

/** A random tree: node i hangs from one of the nodes before it. */
const treeArb = fc.integer({ min: 2, max: 60 }).chain((n) =>
  fc.tuple(...Array.from({ length: n - 1 }, (_, i) => fc.nat(i))).map((parents) => ({
    nodes: Array.from({ length: n }, (_, i): LayoutNode => ({ id: `t${i}`, width: 120, height: 40 })),
    edges: parents.map((p, i): LayoutEdge => ({ id: `e${i}`, source: `t${p}`, target: `t${i + 1}` })),
  })),
);

describe("layoutGraph", () => {
  test.prop([graphArb, effortArb], { numRuns: 150 })(
    "places every node, once, with its size",
    ({ nodes, edges }, effort) => {
      const placed = layoutGraph(nodes, edges, "LR", { effort });
      expect(placed.map((p) => p.id)).toEqual(nodes.map((n) => n.id));
      for (const [i, p] of placed.entries()) {
        expect(Number.isFinite(p.x) && Number.isFinite(p.y)).toBe(true);
        expect([p.width, p.height]).toEqual([nodes[i]!.width, nodes[i]!.height]);
      }
    },
  );

  test.prop([graphArb, effortArb], { numRuns: 150 })("no two nodes overlap", ({ nodes, edges }, effort) => {
    const placed = layoutGraph(nodes, edges, "LR", { effort });
    for (let i = 0; i < placed.length; i++) {
      for (let j = i + 1; j < placed.length; j++) {
        const a = placed[i]!;
        const b = placed[j]!;
        const apart =
          a.x + a.width <= b.x + 1e-6 ||
          b.x + b.width <= a.x + 1e-6 ||
          a.y + a.height <= b.y + 1e-6 ||
          b.y + b.height <= a.y + 1e-6;
        expect(apart, `${a.id} and ${b.id} overlap`).toBe(true);
      }
    }
  });

  test.prop([graphArb, effortArb], { numRuns: 150 })(
    "edges run left to right, except back edges of cycles",
    ({ nodes, edges }, effort) => {
      const placed = new Map(layoutGraph(nodes, edges, "LR", { effort }).map((p) => [p.id, p]));
      for (const e of edges) {
        if (e.source === e.target) continue;
        const s = placed.get(e.source)!;
        const t = placed.get(e.target)!;
        if (t.x + t.width / 2 <= s.x + s.width / 2) {
          expect(reaches(edges, e.target, e.source), `${e.id} points left but is on no cycle`).toBe(true);
        }
      }
    },
  );

  test("a string reads left to right, with its branches one column further", () => {
    const node = (id: string): LayoutNode => ({ id, width: 100, height: 40 });
    const placed = new Map(
      layoutGraph(
        [node("1"), node("1,2"), node("1,2,3"), node("1,2,4")],
        [
          { id: "a", source: "1", target: "1,2" },
          { id: "b", source: "1,2", target: "1,2,3" },
          { id: "c", source: "1,2", target: "1,2,4" },
        ],
      ).map((p) => [p.id, p]),
    );
    expect(placed.get("1")!.x).toBeLessThan(placed.get("1,2")!.x);
    expect(placed.get("1,2,3")!.x).toBe(placed.get("1,2,4")!.x);
    expect(placed.get("1,2,3")!.y).not.toBe(placed.get("1,2,4")!.y);
  });

  test.prop([treeArb], { numRuns: 100 })("a tree laid out fast has no crossing edges", ({ nodes, edges }) => {
    const at = new Map(layoutGraph(nodes, edges, "LR", { effort: "fast" }).map((p) => [p.id, p]));
    for (const a of edges) {
      for (const b of edges) {
        const [s1, t1, s2, t2] = [a.source, a.target, b.source, b.target].map((id) => at.get(id)!);
        // Two edges between the same two columns cross when their ends swap order.
        if (a.id >= b.id || s1!.x !== s2!.x || t1!.x !== t2!.x) continue;
        expect((s1!.y - s2!.y) * (t1!.y - t2!.y), `${a.id} crosses ${b.id}`).toBeGreaterThanOrEqual(0);
      }
    }
  });

  // Reference: dagre itself. The fast effort orders each rank with its own
  // depth-first pass; dagre's `disableOptimalOrderHeuristic` keeps the same
  // first order, so the two must place every node at the same point.
  test.prop([graphArb], { numRuns: 100 })(
    "the fast order places nodes as dagre's own first order does",
    ({ nodes, edges }) => {
      const g = new dagre.graphlib.Graph({ multigraph: true });
      g.setGraph({ rankdir: "LR", nodesep: 24, ranksep: 72, marginx: 0, marginy: 0, ranker: "tight-tree" });
      g.setDefaultEdgeLabel(() => ({}));
      for (const n of nodes) g.setNode(n.id, { width: n.width, height: n.height });
      for (const e of edges) if (e.source !== e.target) g.setEdge(e.source, e.target, {}, e.id);
      dagre.layout(g, { disableOptimalOrderHeuristic: true });
      for (const p of layoutGraph(nodes, edges, "LR", { effort: "fast" })) {
        const d = g.node(p.id) as { x: number; y: number };
        expect({ x: p.x, y: p.y }, p.id).toEqual({ x: d.x - p.width / 2, y: d.y - p.height / 2 });
      }
    },
  );

  test("large graphs default to the fast effort, small ones to the full one", () => {
    // The same tree, large: fast keeps depth-first order, so the first child of the root sits above its siblings.
    const big = Array.from({ length: 160 }, (_, i): LayoutNode => ({ id: `b${i}`, width: 60, height: 20 }));
    const edges = big
      .slice(1)
      .map((n, i): LayoutEdge => ({ id: `e${i}`, source: `b${Math.floor(i / 4)}`, target: n.id }));
    const byDefault = layoutGraph(big, edges);
    expect(byDefault).toEqual(layoutGraph(big, edges, "LR", { effort: "fast" }));
    const small = big.slice(0, 20);
    expect(layoutGraph(small, edges.slice(0, 19))).toEqual(
      layoutGraph(small, edges.slice(0, 19), "LR", { effort: "minimise" }),
    );
  });
});
