import { z } from "zod";
import {
  explorePathsLimited,
  type ExploreOptions,
  type GraphEdge,
  type GraphNode,
  type MoveGraph,
  type Outcome,
  type PathResult,
  type RangeScale,
} from "./engine";

/** What GET /api/characters/[id]/graph answers, and the Explorer reads. */
export interface GraphResponse {
  game: { slug: string; name: string; fps: number; fastest: number; launchAt: number; range: RangeScale };
  character: { id: number; slug: string; name: string };
  edition: EditionRef;
  editions: EditionRef[];
  roots: string[];
  starters: Starter[];
  cast: { id: number; slug: string; name: string }[];
  graph: MoveGraph;
}

/** See `Starter` in the move queries: the first hit of a string, or a stance move. */
export interface Starter {
  id: string;
  input: string;
  name: string;
  startup: number;
  damage: number;
  from: "standing" | "crouching" | "any";
  stance: string | null;
}

export interface EditionRef {
  id: number;
  slug: string;
  name: string;
  releasedOn: string;
  status: "draft" | "published";
}

export const graphUrl = (characterId: number, edition: string) =>
  `/api/characters/${characterId}/graph?edition=${encodeURIComponent(edition)}`;

/** The most paths the Explorer computes for one root; past it the view says it cut. */
export const EXPLORER_PATH_LIMIT = 20_000;

/** The part of a character's graph reachable from one root: what the Explorer draws. */
export function reachableSubgraph(graph: MoveGraph, rootId: string): MoveGraph {
  const out = new Map<string, GraphEdge[]>();
  for (const e of graph.edges) out.set(e.from, [...(out.get(e.from) ?? []), e]);
  const seen = new Set<string>([rootId]);
  const stack = [rootId];
  while (stack.length > 0) {
    const id = stack.pop()!;
    for (const e of out.get(id) ?? []) {
      if (!seen.has(e.to)) {
        seen.add(e.to);
        stack.push(e.to);
      }
    }
  }
  // Every edge out of a reachable node leads to a reachable node; keep the graph's order.
  return { nodes: graph.nodes.filter((n) => seen.has(n.id)), edges: graph.edges.filter((e) => seen.has(e.from)) };
}

export interface ExplorerPaths {
  paths: PathResult[];
  truncated: boolean;
  /** Paths by the node they end at, shortest first. */
  byEnd: Map<string, PathResult[]>;
  /** Paths by {@link pathKey}, so a selection is found without a scan. */
  byKey: Map<string, PathResult>;
}

export function computePaths(graph: MoveGraph, rootId: string, options: ExploreOptions): ExplorerPaths {
  const { paths, truncated } = explorePathsLimited(graph, rootId, EXPLORER_PATH_LIMIT, options);
  const byEnd = new Map<string, PathResult[]>();
  const byKey = new Map<string, PathResult>();
  for (const p of paths) {
    byKey.set(pathKey(p), p);
    const end = p.nodes[p.nodes.length - 1]!;
    const list = byEnd.get(end);
    if (list) list.push(p);
    else byEnd.set(end, [p]);
  }
  // Stable: among paths of one length, the walk's own order (the graph's edge order).
  for (const list of byEnd.values()) list.sort((a, b) => a.nodes.length - b.nodes.length);
  return { paths, truncated, byEnd, byKey };
}

/**
 * The ending a path's final cancel replaces: the on-block outcome of the hit it cancels, read
 * from the graph (what stopping at that hit leaves). Null when the path does not end in a cancel.
 */
export function hitOnBlockBeforeCancel(
  path: Pick<PathResult, "nodes" | "endsIn">,
  nodes: ReadonlyMap<string, GraphNode>,
): Outcome | null {
  const hit = path.endsIn === "stance" ? nodes.get(path.nodes.at(-2) ?? "") : undefined;
  return hit?.kind === "move" ? hit.onBlock : null;
}

/** A path's identity in the URL: its edge ids (a node id alone is ambiguous in stance cycles). */
export const pathKey = (p: Pick<PathResult, "edges">) => p.edges.join("|");

export interface ExplorerOptions {
  maxDepth: number;
  maxStanceVisits: number;
  fastest: number;
}

/** The Explorer's view: what its store holds and a permalink opens on. */
export interface ExplorerState {
  /** The Edition's slug; switching it fetches that Edition's graph, without a navigation. */
  edition: string;
  /** The selected path, by its edge ids joined (see `pathKey`); "" is the root alone. */
  selected: string | null;
  options: ExplorerOptions;
  /** The character whose moves punish the ending; null: the same character. */
  opponent: number | null;
}

/** What the Explorer keeps in the search params, so a reload or a shared address opens the same view. */
export const explorerSearchSchema = z.object({
  edition: z
    .string()
    .regex(/^[a-z0-9-]{1,32}$/)
    .optional()
    .catch(undefined),
  path: z.string().max(4000).optional().catch(undefined),
  depth: z.coerce.number().int().min(1).max(16).optional().catch(undefined),
  visits: z.coerce.number().int().min(0).max(4).optional().catch(undefined),
  fastest: z.coerce.number().int().min(1).max(30).optional().catch(undefined),
  vs: z.coerce.number().int().positive().optional().catch(undefined),
});

export type ExplorerSearch = z.infer<typeof explorerSearchSchema>;

export function parseExplorerSearch(params: Record<string, string | string[] | undefined>): ExplorerSearch {
  const flat = Object.fromEntries(Object.entries(params).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v]));
  return explorerSearchSchema.parse(flat);
}
