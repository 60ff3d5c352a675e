import { fc } from "@fast-check/vitest";
import type { ExploreOptions, GraphEdge, GraphNode, Level, MoveGraph } from "../../../src/lib/engine";
import { optionsArb } from "./random-graphs";

// Edits of invented move graphs, as a data editor makes them between two Editions. Every
// edit keeps the graph valid; ids stay the keys.

const LEVELS: Level[] = ["high", "mid", "low", "special-mid", "throw", "unblockable"];

/** The fields an editor may change on each kind of node and edge (never id, kind, from, to). */
export const EDITABLE: Record<GraphNode["kind"] | GraphEdge["kind"], readonly string[]> = {
  move: ["input", "level", "damage", "startup", "onBlock", "onHit", "onCounterHit", "name", "range", "tags", "notes"],
  stance: ["name"],
  follow: ["input", "gapOnBlock", "comboOnHit", "comboOnCounterHit"],
  cancel: ["input", "onBlock", "onHit", "onCounterHit", "autoGuard"],
  enter: ["input"],
};

/** The fields the compared path fields are computed from (DESIGN.md, "Path semantics"). */
export const READ_BY_PATHS: Record<GraphNode["kind"] | GraphEdge["kind"], readonly string[]> = {
  move: ["startup", "onBlock", "onHit"],
  stance: [],
  follow: ["gapOnBlock", "comboOnHit"],
  cancel: ["onBlock", "onHit"],
  enter: [],
};

const OPTIONAL = new Set(["startup", "name", "range", "tags", "notes"]);

/**
 * A value of `field` that differs from `old` (undefined: the field is left out), picked by
 * `k` (1 to 5). With k = 1 an optional field that is there is left out.
 */
export function otherValue(field: string, old: unknown, k: number): unknown {
  if (old !== undefined && k === 1 && OPTIONAL.has(field)) return undefined;
  switch (field) {
    case "level":
      return LEVELS[(LEVELS.indexOf(old as Level) + k) % LEVELS.length];
    case "onBlock":
    case "onHit":
    case "onCounterHit":
      return typeof old === "number" ? old + k : k;
    case "damage":
    case "gapOnBlock":
    case "startup":
      return typeof old === "number" ? old + k : k;
    case "range":
      return typeof old === "number" ? old + k : `${String(old ?? "")}far`;
    case "comboOnHit":
    case "comboOnCounterHit":
      return !old;
    case "tags":
      return [...((old as string[] | undefined) ?? []), `tag${k}`];
    case "autoGuard": {
      const level = LEVELS[k % LEVELS.length]!;
      const levels = old as Level[];
      return levels.includes(level) ? levels.filter((l) => l !== level) : [...levels, level];
    }
    default:
      return `${String(old ?? "")}'`;
  }
}

/** One field edit: which item (node or edge, by index modulo their count), which field, which new value. */
export interface FieldEdit {
  node: boolean;
  item: number;
  field: number;
  k: number;
}

export const fieldEditArb: fc.Arbitrary<FieldEdit> = fc.record({
  node: fc.boolean(),
  item: fc.nat(),
  field: fc.nat(),
  k: fc.integer({ min: 1, max: 5 }),
});

export interface EditedField {
  id: string;
  node: boolean;
  field: string;
  before: unknown;
  after: unknown;
}

/**
 * `graph` with the field edits applied, each (item, field) at most once, and what each one
 * changed (before and after as read, undefined where the field is left out).
 */
export function applyFieldEdits(
  graph: MoveGraph,
  edits: readonly FieldEdit[],
  editable = EDITABLE,
): { graph: MoveGraph; edited: EditedField[] } {
  const next = structuredClone(graph);
  const edited: EditedField[] = [];
  const done = new Set<string>();
  for (const edit of edits) {
    const items: (GraphNode | GraphEdge)[] = edit.node ? next.nodes : next.edges;
    if (items.length === 0) continue;
    const item = items[edit.item % items.length]! as unknown as Record<string, unknown> & { id: string; kind: string };
    const fields = editable[item.kind as GraphNode["kind"]];
    if (fields.length === 0) continue;
    const field = fields[edit.field % fields.length]!;
    const key = `${edit.node ? "node" : "edge"} ${item.id} ${field}`;
    if (done.has(key)) continue;
    done.add(key);
    const before = item[field];
    const after = otherValue(field, before, edit.k);
    if (after === undefined) delete item[field];
    else item[field] = after;
    edited.push({ id: item.id, node: edit.node, field, before, after });
  }
  return { graph: next, edited };
}

/** A change between Editions that may also change the graph's shape. */
export type Edit =
  | { kind: "field"; edit: FieldEdit }
  | { kind: "drop-edge"; edge: number }
  | { kind: "drop-node"; node: number }
  | { kind: "add-move"; from: number; k: number }
  | { kind: "add-follow"; from: number; to: number; k: number }
  | { kind: "retarget"; edge: number; to: number }
  | { kind: "reorder" };

export const editArb: fc.Arbitrary<Edit> = fc.oneof(
  { weight: 4, arbitrary: fieldEditArb.map((edit) => ({ kind: "field" as const, edit })) },
  fc.record({ kind: fc.constant("drop-edge" as const), edge: fc.nat() }),
  fc.record({ kind: fc.constant("drop-node" as const), node: fc.nat() }),
  fc.record({ kind: fc.constant("add-move" as const), from: fc.nat(), k: fc.integer({ min: -12, max: 6 }) }),
  fc.record({
    kind: fc.constant("add-follow" as const),
    from: fc.nat(),
    to: fc.nat(),
    k: fc.integer({ min: -2, max: 4 }),
  }),
  fc.record({ kind: fc.constant("retarget" as const), edge: fc.nat(), to: fc.nat() }),
  fc.constant({ kind: "reorder" as const }),
);

/** `graph` with the edits applied in order; an edit that finds nothing to act on does nothing. */
export function applyEdits(graph: MoveGraph, edits: readonly Edit[]): MoveGraph {
  let g = structuredClone(graph);
  let fresh = 0;
  const moves = () => g.nodes.filter((n) => n.kind === "move");
  const stances = () => g.nodes.filter((n) => n.kind === "stance");
  const at = <T>(xs: readonly T[], i: number): T | undefined => (xs.length === 0 ? undefined : xs[i % xs.length]);
  for (const edit of edits) {
    switch (edit.kind) {
      case "field":
        g = applyFieldEdits(g, [edit.edit]).graph;
        break;
      case "drop-edge": {
        const edge = at(g.edges, edit.edge);
        g.edges = g.edges.filter((e) => e !== edge);
        break;
      }
      case "drop-node": {
        const node = at(g.nodes, edit.node);
        if (node === undefined) break;
        g.nodes = g.nodes.filter((n) => n !== node);
        g.edges = g.edges.filter((e) => e.from !== node.id && e.to !== node.id);
        break;
      }
      case "add-move": {
        const from = at(g.nodes, edit.from);
        const id = `new${fresh++}`;
        g.nodes.push({
          id,
          kind: "move",
          input: `${id}`,
          level: LEVELS[Math.abs(edit.k) % LEVELS.length]!,
          damage: 12,
          startup: 12,
          onBlock: edit.k,
          onHit: edit.k + 6,
          onCounterHit: edit.k + 8,
        });
        if (from?.kind === "move") {
          g.edges.push({
            id: `${id}-in`,
            kind: "follow",
            from: from.id,
            to: id,
            input: ",9",
            gapOnBlock: edit.k % 3,
            comboOnHit: edit.k % 2 === 0,
            comboOnCounterHit: true,
          });
        } else if (from?.kind === "stance") {
          g.edges.push({ id: `${id}-in`, kind: "enter", from: from.id, to: id, input: "9" });
        }
        break;
      }
      case "add-follow": {
        const from = at(moves(), edit.from);
        const to = at(moves(), edit.to);
        if (from === undefined || to === undefined) break;
        g.edges.push({
          id: `link${fresh++}`,
          kind: "follow",
          from: from.id,
          to: to.id,
          input: ",8",
          gapOnBlock: edit.k,
          comboOnHit: edit.k <= 0,
          comboOnCounterHit: true,
        });
        break;
      }
      case "retarget": {
        const edge = at(g.edges, edit.edge);
        const to = at<GraphNode>(edge?.kind === "cancel" ? stances() : moves(), edit.to);
        if (edge !== undefined && to !== undefined) edge.to = to.id;
        break;
      }
      case "reorder":
        g.nodes.reverse();
        g.edges.reverse();
        break;
    }
  }
  return g;
}

/** Two Editions to compare: a graph, the same graph after up to six edits of any kind, and the options for both. */
export function editedPairs(
  graphs: fc.Arbitrary<MoveGraph>,
): fc.Arbitrary<[MoveGraph, MoveGraph, Required<ExploreOptions>]> {
  return graphs.chain((g) =>
    fc.tuple(
      fc.constant(g),
      fc.array(editArb, { maxLength: 6 }).map((edits) => applyEdits(g, edits)),
      optionsArb,
    ),
  );
}
