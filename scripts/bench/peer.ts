import { DirectedGraph } from "graphology";
import { allSimplePaths } from "graphology-simple-path";
import { GUARDS } from "../../src/lib/engine";
import type {
  BlockClass,
  Gap,
  CancelEdge,
  ExploreOptions,
  GraphEdge,
  GraphNode,
  Guard,
  Level,
  MoveGraph,
  MoveNode,
  PathResult,
} from "../../src/lib/engine";

const SINK = "\u0000every-stop";

/**
 * The peer: graphology holds the graph and graphology-simple-path enumerates the paths;
 * every annotation is then computed per path, the way one would without the engine.
 *
 * allSimplePaths lists the paths between one source and one target. To get every place a
 * path may stop in one enumeration, every node gets an extra edge to one added sink node:
 * the simple paths root → … → x → sink are exactly the simple paths from the root that stop
 * at x, for every x (the root alone included). Called per target instead, it would walk the
 * whole tree once per node. Only valid on a graph without cycles and parallel edges, where
 * simple paths are the engine's paths when no bound cuts them.
 */
export function peerPaths(
  g: MoveGraph,
  root: string,
  { fastest = 10, launchAt = 15 }: ExploreOptions = {},
): PathResult[] {
  const graph = new DirectedGraph<Record<string, unknown>, { edge: GraphEdge }>();
  for (const n of g.nodes) graph.addNode(n.id, { node: n });
  for (const e of g.edges) graph.addDirectedEdgeWithKey(e.id, e.from, e.to, { edge: e });
  graph.addNode(SINK);
  for (const n of g.nodes) graph.addDirectedEdge(n.id, SINK);

  const nodeOf = (id: string) => graph.getNodeAttribute(id, "node") as GraphNode;
  const mixup = new Map<string, boolean>();
  graph.forEachNode((id, attrs) => {
    const node = attrs.node as GraphNode | undefined;
    if (node?.kind !== "move") return;
    const sets = new Set<string>();
    graph.forEachOutEdge(id, (_key, a, _src, target) => {
      if (a.edge?.kind === "follow") sets.add(GUARDS[(nodeOf(target) as MoveNode).level].join("+"));
    });
    mixup.set(id, sets.size >= 2);
  });

  const raw = allSimplePaths(graph, root, SINK);
  const out: PathResult[] = new Array(raw.length);
  for (let k = 0; k < raw.length; k++) {
    const ids = raw[k]!;
    ids.pop();
    out[k] = annotate(ids);
  }
  return out;

  function annotate(ids: string[]): PathResult {
    const nodes = ids.map(nodeOf);
    const edges = ids.slice(1).map((to, i) => graph.getEdgeAttribute(graph.edge(ids[i], to), "edge") as GraphEdge);
    const first = nodes[0] as MoveNode;
    const levels: Level[] = [];
    // The same frozen per-level guard lists the engine shares, so both build the same output.
    const guards: (readonly Guard[])[] = [];
    const gaps: Gap[] = [];
    const duckable: number[] = [];
    const mixupPoints: string[] = [];
    const autoGuard: Level[] = [];
    let damage = 0;
    let naturalCombo = true;
    let jails = true;
    let input = first.input;
    for (const e of edges) input += e.input;
    for (let i = 0; i < nodes.length; i++) {
      const node = nodes[i]!;
      const step = i > 0 ? edges[i - 1] : undefined;
      if (step?.kind === "cancel") {
        for (const l of step.autoGuard) if (!autoGuard.includes(l)) autoGuard.push(l);
      }
      if (node.kind !== "move") continue;
      const hit = levels.length;
      levels.push(node.level);
      guards.push(GUARDS[node.level]);
      damage += node.damage;
      if (mixup.get(node.id)) mixupPoints.push(node.id);
      if (hit === 0) {
        if (node.level === "high") duckable.push(0);
        continue;
      }
      let gap: number | undefined;
      let combo = false;
      if (step?.kind === "follow") {
        gap = step.gapOnBlock;
        combo = step.comboOnHit;
      } else {
        const cancel = edges[i - 2];
        if (cancel?.kind === "cancel" && node.startup !== undefined) {
          if (typeof cancel.onBlock === "number") gap = node.startup - cancel.onBlock - 1;
          combo = typeof cancel.onHit === "number" && node.startup <= cancel.onHit;
        }
      }
      if (!combo) naturalCombo = false;
      if (gap === undefined || gap > 0) jails = false;
      if (gap !== undefined && gap > 0) {
        gaps.push({ after: hit - 1, frames: gap });
        if (node.level === "high") duckable.push(hit);
      }
    }
    const last = nodes[nodes.length - 1]!;
    const step = last.kind === "move" ? last : (edges[edges.length - 1] as CancelEdge);
    let framesSaved: number | null = null;
    if (last.kind === "stance") {
      const before = nodes[nodes.length - 2] as MoveNode;
      if (typeof step.onBlock === "number" && typeof before.onBlock === "number")
        framesSaved = step.onBlock - before.onBlock;
    }
    const a = step.onBlock;
    const blockClass: BlockClass =
      typeof a !== "number"
        ? "state"
        : a >= 1
          ? "plus"
          : a === 0
            ? "even"
            : a > -fastest
              ? "safe"
              : a > -launchAt
                ? "punishable"
                : "launch-punishable";
    return {
      nodes: ids,
      edges: edges.map((e) => e.id),
      input,
      levels,
      damage,
      endsIn: last.kind,
      onBlock: step.onBlock,
      onHit: step.onHit,
      onCounterHit: step.onCounterHit,
      framesSaved,
      blockClass,
      defenderStance: levels[levels.length - 1] === "low" ? "crouching" : "standing",
      guards,
      naturalCombo,
      jails,
      gaps,
      duckable,
      mixupPoints,
      autoGuard,
    };
  }
}
