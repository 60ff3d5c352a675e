import { fc, test } from "@fast-check/vitest";
import { DirectedGraph, MultiDirectedGraph } from "graphology";
import { allSimplePaths } from "graphology-simple-path";
import { describe, expect } from "vitest";
import { explorePaths, type MoveGraph } from "../../../src/lib/engine";
import { graphArb } from "../../unit/engine/random-graphs";

// Reference: graphology-simple-path's allSimplePaths (npm). On a graph without cycles every
// engine path is a simple path and every simple path from the root stops somewhere, so the
// engine's node sequences must be exactly the root alone plus allSimplePaths to each target.

const acyclic = graphArb({ moves: 7, stances: 3, acyclic: true });
// Loose enough that no bound cuts a path of a 10-node graph without cycles.
const unbounded = { maxDepth: 16, maxStanceVisits: 1 };

function withoutParallelEdges(g: MoveGraph): MoveGraph {
  const seen = new Set<string>();
  return {
    nodes: g.nodes,
    edges: g.edges.filter((e) => {
      const k = `${e.from}>${e.to}`;
      if (seen.has(k)) return false;
      seen.add(k);
      return true;
    }),
  };
}

function referencePaths(graph: DirectedGraph | MultiDirectedGraph, root: string): string[] {
  const out = [root];
  graph.forEachNode((target) => {
    if (target === root) return;
    for (const p of allSimplePaths(graph, root, target)) out.push(p.join(" "));
  });
  return out.sort();
}

const moveRoot = (g: MoveGraph) => fc.constantFrom(...g.nodes.filter((n) => n.kind === "move").map((n) => n.id));

describe("engine paths against graphology allSimplePaths", () => {
  test.prop([acyclic.map(withoutParallelEdges).chain((g) => fc.tuple(fc.constant(g), moveRoot(g)))], { numRuns: 300 })(
    "on a simple graph without cycles the path lists are equal",
    ([g, root]) => {
      const ref = new DirectedGraph();
      for (const n of g.nodes) ref.addNode(n.id);
      for (const e of g.edges) ref.addDirectedEdgeWithKey(e.id, e.from, e.to);
      const engine = explorePaths(g, root, unbounded)
        .map((p) => p.nodes.join(" "))
        .sort();
      expect(engine).toEqual(referencePaths(ref, root));
    },
  );

  test.prop([acyclic.chain((g) => fc.tuple(fc.constant(g), moveRoot(g)))], { numRuns: 300 })(
    "with parallel edges the engine's distinct node sequences equal graphology's",
    ([g, root]) => {
      const ref = new MultiDirectedGraph();
      for (const n of g.nodes) ref.addNode(n.id);
      for (const e of g.edges) ref.addDirectedEdgeWithKey(e.id, e.from, e.to);
      const engine = [...new Set(explorePaths(g, root, unbounded).map((p) => p.nodes.join(" ")))].sort();
      expect(engine).toEqual(referencePaths(ref, root));
    },
  );
});
