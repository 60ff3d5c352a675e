import "server-only";
import { LRUCache } from "lru-cache";
import type { ItemChange } from "@/components/changes/item-changes";
import { changedPathRows, summariseChanges, summaryPhrases, type ChangedPathRow } from "@/lib/changes";
import {
  diffGraphs,
  type ExploreOptions,
  type GraphEdge,
  type GraphNode,
  type ItemsDiff,
  type MoveGraph,
} from "@/lib/engine";
import { getCharacterGraph } from "@/server/db/queries/moves";

/** Everything the "What changed" page shows of two Editions of one character, before any filter or page. */
export interface Comparison {
  phrases: string[];
  moves: ItemChange[];
  stances: ItemChange[];
  links: ItemChange[];
  /** Every changed path, in the diff's order. */
  rows: ChangedPathRow[];
}

/**
 * Comparisons of two published Editions, which never change (DESIGN.md: publishing freezes an
 * Edition's rows, and the database refuses writes to them), so paging, sorting and filtering
 * read the same diff again instead of computing it. Keyed by character, both Editions and the
 * game's rules; a draft's comparison is never kept, since its rows may change any time. Bounded
 * by the paths held in all (a 300-move character's patch lists some 90,000), least recently used
 * first out. One per server process: a published pair costs one diff per process.
 */
const published = new LRUCache<string, Comparison>({
  max: 64,
  maxSize: 400_000,
  sizeCalculation: (c) => c.rows.length + c.moves.length + c.stances.length + c.links.length + 1,
});

/**
 * What changed for a character from one Edition to another, with the game's rules on both
 * sides. The caller has already checked that the viewer may read the game: this reads no
 * permission and must stay behind that check.
 */
export async function compareEditions({
  characterId,
  from,
  to,
  options,
}: {
  characterId: number;
  from: { id: number; status: "draft" | "published" };
  to: { id: number; status: "draft" | "published" };
  options: Required<Pick<ExploreOptions, "fastest" | "launchAt">>;
}): Promise<Comparison> {
  const frozen = from.status === "published" && to.status === "published";
  const key = `${characterId}:${from.id}:${to.id}:${options.fastest}:${options.launchAt}`;
  const kept = frozen ? published.get(key) : undefined;
  if (kept !== undefined) return kept;

  const [before, after] = await Promise.all([
    getCharacterGraph({ characterId, editionId: from.id }),
    getCharacterGraph({ characterId, editionId: to.id }),
  ]);
  const diff = diffGraphs(before.graph, after.graph, options);
  const nodes = itemChanges(diff.nodes, before.graph, after.graph);
  const comparison: Comparison = {
    phrases: summaryPhrases(summariseChanges(diff, before.graph, after.graph)),
    moves: nodes.filter((c) => c.kind === "move"),
    stances: nodes.filter((c) => c.kind === "stance"),
    links: edgeChanges(diff.edges, before.graph, after.graph),
    rows: changedPathRows(diff, before.graph, after.graph, options),
  };
  if (frozen) published.set(key, comparison);
  return comparison;
}

/** Nodes added, removed and changed, each with its input and name from the side that has it. */
function itemChanges(
  diff: ItemsDiff,
  before: MoveGraph,
  after: MoveGraph,
): (ItemChange & { kind: GraphNode["kind"] })[] {
  const was = new Map(before.nodes.map((n) => [n.id, n]));
  const now = new Map(after.nodes.map((n) => [n.id, n]));
  const describe = (n: GraphNode) =>
    n.kind === "move" ? { input: n.input, name: n.name ?? null } : { input: null, name: n.name };
  const of = (id: string, status: ItemChange["status"], changes: ItemChange["changes"] = []) => {
    const node = (status === "removed" ? was.get(id) : now.get(id)) ?? was.get(id)!;
    return { id, status, changes, kind: node.kind, ...describe(node) };
  };
  return [
    ...diff.changed.map((c) => of(c.id, "changed", c.changes)),
    ...diff.added.map((id) => of(id, "added")),
    ...diff.removed.map((id) => of(id, "removed")),
  ];
}

/** Links (follow-ups, cancels, stance moves) by what is entered: the input of the move they leave and their own. */
function edgeChanges(diff: ItemsDiff, before: MoveGraph, after: MoveGraph): ItemChange[] {
  const describe = (graph: MoveGraph, id: string) => {
    const edge = graph.edges.find((e) => e.id === id);
    if (!edge) return null;
    const start = graph.nodes.find((n) => n.id === edge.from);
    const startInput = start?.kind === "move" ? start.input : (start?.name ?? edge.from);
    return { input: `${startInput}${start?.kind === "stance" ? " " : ""}${edge.input}`, name: EDGE_KIND[edge.kind] };
  };
  const of = (id: string, status: ItemChange["status"], changes: ItemChange["changes"] = []): ItemChange => {
    const side = (status === "removed" ? describe(before, id) : describe(after, id)) ?? describe(before, id);
    return { id, status, changes, input: side?.input ?? id, name: side?.name ?? null };
  };
  return [
    ...diff.changed.map((c) => of(c.id, "changed", c.changes)),
    ...diff.added.map((id) => of(id, "added")),
    ...diff.removed.map((id) => of(id, "removed")),
  ];
}

const EDGE_KIND: Record<GraphEdge["kind"], string> = {
  follow: "follow-up",
  cancel: "stance cancel",
  enter: "move from a stance",
};
