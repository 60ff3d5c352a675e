import type { MoveGraph, StanceSheet } from "@/lib/engine";
import { pathKey } from "@/lib/explorer";

/** The address parameter of the filter "only cancels that turn a punishable ending safe" ("1": on). */
export const SAFE_ONLY_PARAM = "safe";
/** The address parameter of the filter "stance moves that reach at d" (a distance in the game's unit). */
export const REACH_PARAM = "reach";

/** A stance node's id in the graph from the stance's key, as the character file names it. */
export const STANCE_NODE_PREFIX = "stance:";
export const stanceNodeIdOf = (key: string) => `${STANCE_NODE_PREFIX}${key}`;
/** The stance's key from its node id; null for a node id that names no stance. */
export const stanceKeyOf = (nodeId: string) =>
  nodeId.startsWith(STANCE_NODE_PREFIX) ? nodeId.slice(STANCE_NODE_PREFIX.length) : null;

/** Where the Explorer shows a way in: the string's first move and the path's edge ids (`pathKey`). */
export interface WayInPath {
  root: string;
  path: string;
}

/**
 * For each way in, the Explorer path that ends in it: from the cancelled move back through its
 * incoming follow edges to the string's first move (the first such edge in the graph's order
 * where several lead in), then the cancel. A move reached from a stance is itself a root.
 */
export function wayInPaths(graph: MoveGraph, sheet: Pick<StanceSheet, "waysIn">): Record<string, WayInPath> {
  const followInto = new Map<string, { id: string; from: string }>();
  for (const e of graph.edges) if (e.kind === "follow" && !followInto.has(e.to)) followInto.set(e.to, e);
  const out: Record<string, WayInPath> = {};
  for (const w of sheet.waysIn) {
    const edges = [w.cancel];
    const seen = new Set<string>([w.from]);
    let at = w.from;
    for (let e = followInto.get(at); e && !seen.has(e.from); e = followInto.get(at)) {
      edges.unshift(e.id);
      at = e.from;
      seen.add(at);
    }
    out[w.cancel] = { root: at, path: pathKey({ edges }) };
  }
  return out;
}
