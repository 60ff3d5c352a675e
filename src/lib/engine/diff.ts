import { compileGraph, type CompiledGraph } from "./compile";
import type {
  ChangedItem,
  ExploreOptions,
  FieldChange,
  GraphEdge,
  GraphDiff,
  ItemsDiff,
  MoveGraph,
  PathChange,
  PathView,
} from "./types";
import { PathWalker, resolveOptions, type PassOver } from "./walk";

/**
 * What changed between two graphs of one character (DESIGN.md, "Editions over time"): nodes
 * and edges added, removed and changed field by field, and every path that exists on one side
 * only or whose block class, on-hit outcome, natural combo or jail differs. Node and edge ids
 * are the keys stable across Editions; both sides are explored with the same options.
 */
export function diffGraphs(before: MoveGraph, after: MoveGraph, options?: ExploreOptions): GraphDiff {
  const resolved = resolveOptions(options);
  const nodes = diffItems(before.nodes, after.nodes);
  const edges = diffItems(before.edges, after.edges);
  const order = edgeOrder(before, after);
  const was = new Side(before, order);
  const now = new Side(after, order);
  const where = new Where(before, after, nodes, edges);
  const wasChanges = new Changes(was.compiled, where, resolved.maxDepth);
  const nowChanges = new Changes(now.compiled, where, resolved.maxDepth);
  const paths: PathChange[] = [];
  const roots = [...new Set([...was.roots, ...now.roots])].sort(byCodeUnits);
  for (const root of roots) {
    const a = was.roots.has(root) ? new PathWalker(was.compiled, root, resolved) : null;
    const b = now.roots.has(root) ? new PathWalker(now.compiled, root, resolved) : null;
    // Roots come in order, so sorting each root's paths by input sorts the whole list.
    for (const path of sortByInput(diffPathsFrom(root, a, b, was, now, wasChanges, nowChanges))) paths.push(path);
  }
  return { nodes, edges, paths };
}

/**
 * The order both walks take edges in, as a rank per edge id: ids in code unit order, so an
 * edge has the same rank on both sides and the walks list the paths from a root in the order
 * of their edge ids (a path before those that extend it), which lets them merge like two
 * sorted lists with no index of either.
 */
function edgeOrder(before: MoveGraph, after: MoveGraph): ReadonlyMap<string, number> {
  const ids = [...new Set([...before.edges.map((e) => e.id), ...after.edges.map((e) => e.id)])].sort(byCodeUnits);
  return new Map(ids.map((id, rank) => [id, rank]));
}

/** One graph ready to walk, its edges compiled in the shared order (`edgeOrder`). */
class Side {
  readonly compiled: CompiledGraph;
  /** Move nodes with no incoming follow edge. */
  readonly roots: ReadonlySet<string>;
  /** Per compiled edge index, the edge's rank in the shared order. */
  readonly rank: Int32Array;

  constructor(graph: MoveGraph, order: ReadonlyMap<string, number>) {
    const edges = [...graph.edges].sort((a, b) => order.get(a.id)! - order.get(b.id)!);
    this.compiled = compileGraph({ nodes: graph.nodes, edges });
    this.rank = Int32Array.from(edges, (e) => order.get(e.id)!);
    const followed = new Set(graph.edges.filter((e) => e.kind === "follow").map((e) => e.to));
    this.roots = new Set(graph.nodes.filter((n) => n.kind === "move" && !followed.has(n.id)).map((n) => n.id));
  }
}

/**
 * The fields of a node that the steps after it read: whether it is a move, and its startup
 * (the gap and combo of an enter after a cancel, which every longer path carries). Its other
 * fields only count for the paths that end on it.
 */
const CARRIED_FIELDS: ReadonlySet<string> = new Set(["kind", "startup"]);

/** Where the graphs differ, by id. */
class Where {
  /** Nodes changed in a field the steps after them read. */
  readonly carried: ReadonlySet<string>;
  /** Nodes changed in any field. */
  readonly changedNodes: ReadonlySet<string>;
  /** Edges added, removed or changed. */
  readonly changedEdges: ReadonlySet<string>;
  /** Per node, the fewest moves a path going on from it enters up to a change, in either graph (none: never). */
  readonly movesToChange: ReadonlyMap<string, number>;

  constructor(before: MoveGraph, after: MoveGraph, nodes: ItemsDiff, edges: ItemsDiff) {
    this.carried = new Set(
      nodes.changed.filter((c) => c.changes.some((f) => CARRIED_FIELDS.has(f.field))).map((c) => c.id),
    );
    this.changedNodes = new Set(nodes.changed.map((c) => c.id));
    this.changedEdges = new Set([...edges.added, ...edges.removed, ...edges.changed.map((c) => c.id)]);
    const ends = new Set([...nodes.added, ...nodes.removed, ...this.changedNodes]);
    const fewest = movesToChange(before, ends, this.changedEdges);
    for (const [id, moves] of movesToChange(after, ends, this.changedEdges)) {
      fewest.set(id, Math.min(moves, fewest.get(id) ?? moves));
    }
    this.movesToChange = fewest;
  }
}

/**
 * Where the graphs differ, as flags by one side's compiled indexes (the walk checks them at
 * every step it takes), to tell which paths must be compared one by one. A path that takes no
 * changed edge and no node changed in a carried field (a clean path) is extended the same way
 * on both sides until an extension takes a changed edge or enters a changed node; when the
 * bounds let no extension get that far, every extension is the same on both sides.
 */
class Changes {
  private readonly carried: Uint8Array;
  private readonly changedNode: Uint8Array;
  private readonly changedEdge: Uint8Array;
  /** -1: never. */
  private readonly movesToChange: Int32Array;
  private readonly isMove: Uint8Array;
  private readonly maxDepth: number;

  constructor(walked: CompiledGraph, where: Where, maxDepth: number) {
    this.maxDepth = maxDepth;
    const nodeFlags = (ids: ReadonlySet<string>) => Uint8Array.from(walked.nodeIds, (id) => (ids.has(id) ? 1 : 0));
    this.carried = nodeFlags(where.carried);
    this.changedNode = nodeFlags(where.changedNodes);
    this.changedEdge = Uint8Array.from(walked.edgeIds, (id) => (where.changedEdges.has(id) ? 1 : 0));
    this.movesToChange = Int32Array.from(walked.nodeIds, (id) => where.movesToChange.get(id) ?? -1);
    this.isMove = walked.isMove;
  }

  /**
   * Whether the step into position i of the walk's current path is clean: it takes no changed
   * edge and enters no node changed in a carried field.
   */
  cleanStep(path: PathWalker, i: number): boolean {
    return this.carried[path.nodeIndexAt(i)] === 0 && (i === 0 || this.changedEdge[path.edgeIndexAt(i - 1)] === 0);
  }

  /**
   * Whether the walk's current path, found on both sides, has the same four compared fields on
   * both, given whether every step of it is clean: its ending reads its last node (or the
   * cancel into the stance it ends in, an edge of the path), and its combo and jail read only
   * its steps.
   */
  sameHere(path: PathWalker, clean: boolean): boolean {
    return clean && this.changedNode[path.nodeIndexAt(path.length - 1)] === 0;
  }

  /**
   * Whether every path that extends the walk's current one, found on both sides, is the same
   * on both, given whether every step of the current path is clean (`cleanStep`).
   */
  sameBelow(path: PathWalker, clean: boolean): boolean {
    return clean && this.noChangeWithin(path.nodeIndexAt(path.length - 1), path.hitCount);
  }

  private noChangeWithin(node: number, hits: number): boolean {
    const moves = this.movesToChange[node]!;
    return moves < 0 || hits + moves > this.maxDepth;
  }

  /**
   * The steps a walk may pass over, given `clean[d]` for each position d of its current path:
   * from a clean path, an unchanged edge into an unchanged node below which no change is
   * within reach leads to a path that is the same on both sides, as is every path extending
   * it. Each side passes over the same steps, since a clean path is on both sides alike.
   */
  sameSteps(clean: readonly boolean[]): PassOver {
    return (d, edge, to, hits) =>
      clean[d] === true &&
      this.changedEdge[edge] === 0 &&
      this.changedNode[to] === 0 &&
      this.noChangeWithin(to, hits + this.isMove[to]!);
  }
}

/**
 * For each node of `graph` from which a path can go on to take one of the changed edges or
 * enter one of the changed nodes, the fewest moves it enters on the way, that last step
 * included (entering a stance costs none). Dial's shortest paths backwards from those last
 * steps: bucket k holds the nodes offered at k moves, read in order, and a node keeps the
 * first bucket that reaches it.
 */
function movesToChange(graph: MoveGraph, nodes: ReadonlySet<string>, edges: ReadonlySet<string>): Map<string, number> {
  const moveIds = new Set(graph.nodes.filter((n) => n.kind === "move").map((n) => n.id));
  const cost = (edge: GraphEdge) => (moveIds.has(edge.to) ? 1 : 0);
  const into = new Map<string, GraphEdge[]>();
  for (const edge of graph.edges) {
    const list = into.get(edge.to);
    if (list === undefined) into.set(edge.to, [edge]);
    else list.push(edge);
  }
  const buckets: string[][] = [];
  const offer = (id: string, moves: number) => (buckets[moves] ??= []).push(id);
  for (const edge of graph.edges) if (edges.has(edge.id) || nodes.has(edge.to)) offer(edge.from, cost(edge));
  const fewest = new Map<string, number>();
  for (let moves = 0; moves < buckets.length; moves++) {
    // A stance edge costs nothing, so the bucket being read may still grow.
    const bucket = buckets[moves] ?? [];
    for (let i = 0; i < bucket.length; i++) {
      const id = bucket[i]!;
      if (fewest.has(id)) continue;
      fewest.set(id, moves);
      for (const edge of into.get(id) ?? []) offer(edge.from, moves + cost(edge));
    }
  }
  return fewest;
}

/**
 * Merges the two walks from one root (null: the root is not a root on that side). Both list
 * paths in the order of their edge ids (edgeOrder), so at each step the path that comes first exists on its
 * side only, unless both walks stand on the same path, which is then compared field by field
 * where its steps or its last node changed. Where no path extending it can differ, both walks
 * skip those paths.
 */
function diffPathsFrom(
  root: string,
  before: PathWalker | null,
  after: PathWalker | null,
  was: Side,
  now: Side,
  wasChanges: Changes,
  nowChanges: Changes,
): PathChange[] {
  const out: PathChange[] = [];
  // clean[i]: every step of the walk's current path up to position i is clean. The walk's
  // next path shares all positions but its last with a path it stood on before, so each step
  // of the walk fills in one slot.
  const cleanBefore: boolean[] = [];
  const cleanAfter: boolean[] = [];
  const advance = (walk: PathWalker | null, changes: Changes, clean: boolean[]): boolean => {
    if (walk === null || !walk.advance()) return false;
    const i = walk.length - 1;
    clean[i] = (i === 0 || clean[i - 1] === true) && changes.cleanStep(walk, i);
    return true;
  };
  if (before !== null && after !== null) {
    // A root on one side only lists every path from it: nothing is passed over.
    before.passOver(wasChanges.sameSteps(cleanBefore));
    after.passOver(nowChanges.sameSteps(cleanAfter));
  }
  let a = advance(before, wasChanges, cleanBefore);
  let b = advance(after, nowChanges, cleanAfter);
  while (a || b) {
    const order = !a ? 1 : !b ? -1 : comparePaths(before!, was.rank, after!, now.rank);
    if (order < 0) {
      out.push(pathChange(root, before!, "removed"));
      a = advance(before, wasChanges, cleanBefore);
    } else if (order > 0) {
      out.push(pathChange(root, after!, "added"));
      b = advance(after, nowChanges, cleanAfter);
    } else {
      const clean = cleanAfter[after!.length - 1] === true;
      const changed = nowChanges.sameHere(after!, clean) ? null : pathFieldChanges(before!, after!);
      if (changed !== null) out.push(pathChange(root, after!, "changed", changed));
      if (nowChanges.sameBelow(after!, clean)) {
        before!.skipExtensions();
        after!.skipExtensions();
      }
      a = advance(before, wasChanges, cleanBefore);
      b = advance(after, nowChanges, cleanAfter);
    }
  }
  return out;
}

/** The walks' current paths in the order of their edge ids (by rank), a path before those that extend it. */
function comparePaths(a: PathWalker, aRank: Int32Array, b: PathWalker, bRank: Int32Array): number {
  const shared = Math.min(a.length, b.length) - 1;
  for (let i = 0; i < shared; i++) {
    const order = aRank[a.edgeIndexAt(i)]! - bRank[b.edgeIndexAt(i)]!;
    if (order !== 0) return order;
  }
  return a.length - b.length;
}

/**
 * Which of the compared fields differ between the same path on both sides, in the order
 * "what changed" lists them. Each field is read by name: this runs once per path on both
 * sides, and reading a getter through a computed name is several times slower.
 */
function pathFieldChanges(before: PathView, after: PathView): FieldChange[] | null {
  const blockClass = before.blockClass !== after.blockClass;
  const onHit = !sameValue(before.onHit, after.onHit);
  const naturalCombo = before.naturalCombo !== after.naturalCombo;
  const jails = before.jails !== after.jails;
  if (!blockClass && !onHit && !naturalCombo && !jails) return null;
  const changes: FieldChange[] = [];
  if (blockClass) changes.push({ field: "blockClass", before: before.blockClass, after: after.blockClass });
  if (onHit) changes.push({ field: "onHit", before: before.onHit, after: after.onHit });
  if (naturalCombo) changes.push({ field: "naturalCombo", before: before.naturalCombo, after: after.naturalCombo });
  if (jails) changes.push({ field: "jails", before: before.jails, after: after.jails });
  return changes;
}

/** The entry of the walk's current path. */
function pathChange(
  root: string,
  path: PathWalker,
  status: PathChange["status"],
  changes: FieldChange[] = [],
): PathChange {
  const edges = new Array<string>(path.length - 1);
  for (let i = 0; i < edges.length; i++) edges[i] = path.edgeIdAt(i);
  return { root, edges, input: path.input, status, changes };
}

/** Nodes or edges matched by id; a changed one lists every field that differs, but its id. */
function diffItems<T extends { id: string }>(before: readonly T[], after: readonly T[]): ItemsDiff {
  const was = new Map(before.map((item) => [item.id, item]));
  const now = new Map(after.map((item) => [item.id, item]));
  const changed: ChangedItem[] = [];
  for (const id of [...now.keys()].filter((id) => was.has(id)).sort(byCodeUnits)) {
    const changes = fieldChanges(was.get(id)!, now.get(id)!);
    if (changes.length > 0) changed.push({ id, changes });
  }
  return {
    added: [...now.keys()].filter((id) => !was.has(id)).sort(byCodeUnits),
    removed: [...was.keys()].filter((id) => !now.has(id)).sort(byCodeUnits),
    changed,
  };
}

/** Every field but `id` whose value differs, by field name; a field one side lacks is `null` there. */
function fieldChanges(before: object, after: object): FieldChange[] {
  const was = before as Readonly<Record<string, unknown>>;
  const now = after as Readonly<Record<string, unknown>>;
  const fields = [...new Set([...Object.keys(was), ...Object.keys(now)])].filter((f) => f !== "id").sort(byCodeUnits);
  const changes: FieldChange[] = [];
  for (const field of fields) {
    const a = was[field] ?? null;
    const b = now[field] ?? null;
    if (!sameValue(a, b)) changes.push({ field, before: a, after: b });
  }
  return changes;
}

/** Deep equality of JSON values: numbers, strings, booleans, null, arrays and plain objects (a missing key equals undefined). */
function sameValue(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (Array.isArray(a) || Array.isArray(b)) {
    return Array.isArray(a) && Array.isArray(b) && a.length === b.length && a.every((item, i) => sameValue(item, b[i]));
  }
  if (typeof a !== "object" || typeof b !== "object" || a === null || b === null) return false;
  const was = a as Readonly<Record<string, unknown>>;
  const now = b as Readonly<Record<string, unknown>>;
  // Runs for every compared path that ends in a state, so no list of the keys is built.
  for (const key of Object.keys(was)) if (!sameValue(was[key], now[key])) return false;
  for (const key of Object.keys(now)) if (!Object.hasOwn(was, key) && now[key] !== undefined) return false;
  return true;
}

function byCodeUnits(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/**
 * Paths listed in the order of their edge ids, sorted by input: paths with the same input keep
 * that order, which is the order of their edge ids the contract asks for. Many paths share an
 * input (a stance's moves often have the same few), so equal inputs are grouped and only the
 * distinct ones compared.
 */
function sortByInput(paths: readonly PathChange[]): PathChange[] {
  const byInput = new Map<string, PathChange[]>();
  for (const path of paths) {
    const same = byInput.get(path.input);
    if (same === undefined) byInput.set(path.input, [path]);
    else same.push(path);
  }
  const sorted: PathChange[] = [];
  for (const input of [...byInput.keys()].sort(byCodeUnits)) for (const path of byInput.get(input)!) sorted.push(path);
  return sorted;
}
