import dagre, { type Graph } from "@dagrejs/dagre";

export interface LayoutNode {
  id: string;
  width: number;
  height: number;
}

export interface LayoutEdge {
  id: string;
  source: string;
  target: string;
}

export interface PlacedNode extends LayoutNode {
  /** Top-left corner, as React Flow positions nodes. */
  x: number;
  y: number;
}

export type Direction = "LR" | "TB";

export interface LayoutOptions {
  /** Space between nodes of one rank. */
  nodeSep?: number;
  /** Space between ranks. */
  rankSep?: number;
  /**
   * How hard dagre works on the order within each rank. `"minimise"` runs its
   * crossing-reduction sweeps and network-simplex ranking; `"fast"` keeps the
   * depth-first order (no crossings within a tree, which most strings are)
   * and ranks with a tight tree, for about a third of the time. The default
   * picks `"fast"` from {@link FAST_LAYOUT_FROM} nodes up.
   */
  effort?: "minimise" | "fast";
}

/** From this many nodes, the default layout effort is `"fast"`. */
export const FAST_LAYOUT_FROM = 150;

/**
 * Places a graph with dagre: a fresh dagre graph per call (no state shared
 * between layouts), measured sizes in, top-left positions out. Dagre reverses
 * the back edges of cycles to rank the graph, so those are the only edges
 * that may point against `direction`.
 */
export function layoutGraph(
  nodes: readonly LayoutNode[],
  edges: readonly LayoutEdge[],
  direction: Direction = "LR",
  { nodeSep = 24, rankSep = 72, effort = nodes.length >= FAST_LAYOUT_FROM ? "fast" : "minimise" }: LayoutOptions = {},
): PlacedNode[] {
  const fast = effort === "fast";
  const g = new dagre.graphlib.Graph({ multigraph: true });
  g.setGraph({
    rankdir: direction,
    nodesep: nodeSep,
    ranksep: rankSep,
    marginx: 0,
    marginy: 0,
    ranker: fast ? "tight-tree" : "network-simplex",
  });
  g.setDefaultEdgeLabel(() => ({}));
  for (const n of nodes) g.setNode(n.id, { width: n.width, height: n.height });
  for (const e of edges) {
    if (e.source === e.target) continue; // a self-loop does not change ranks or order
    g.setEdge(e.source, e.target, {}, e.id);
  }
  dagre.layout(g, fast ? { customOrder: depthFirstOrder } : {});
  return nodes.map((n) => {
    const placed = g.node(n.id) as { x: number; y: number };
    // dagre anchors at the centre; React Flow at the top-left corner.
    return { ...n, x: placed.x - n.width / 2, y: placed.y - n.height / 2 };
  });
}

/**
 * Dagre's own first ordering (depth-first from each rank's nodes in turn,
 * which keeps a tree free of crossings), without the crossing-reduction sweeps
 * and without building the per-rank graphs that only those sweeps read.
 */
function depthFirstOrder(g: Graph): void {
  const byRank: string[][] = [];
  const seen = new Set<string>();
  const visit = (v: string) => {
    if (seen.has(v)) return;
    seen.add(v);
    const rank = (g.node(v) as { rank: number }).rank;
    (byRank[rank] ??= []).push(v);
    for (const w of g.successors(v) ?? []) visit(w);
  };
  const simple = g.nodes().filter((v) => g.children(v).length === 0);
  simple.sort((a, b) => (g.node(a) as { rank: number }).rank - (g.node(b) as { rank: number }).rank);
  for (const v of simple) visit(v);
  for (const layer of byRank) layer?.forEach((v, i) => ((g.node(v) as { order: number }).order = i));
}
