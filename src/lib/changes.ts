import { z } from "zod";
import {
  blockClassTrend,
  compareOutcome,
  compileGraph,
  formatOutcome,
  iteratePaths,
  type BlockClass,
  type ExploreOptions,
  type GraphDiff,
  type MoveGraph,
  type PathChange,
  type PathResult,
  type PathView,
} from "./engine";

/**
 * The "What changed" page's words about a diff (DESIGN.md, "Editions over time"): counts of
 * what moved between two Editions of one character, and the sentence that says them.
 */

export interface ClassShift {
  from: BlockClass;
  to: BlockClass;
  count: number;
}

export interface ChangeSummary {
  moves: { added: number; removed: number; changed: number };
  stances: { added: number; removed: number; changed: number };
  /** Follow-ups, cancels and stance entries (the graph's edges). */
  links: { added: number; removed: number; changed: number };
  paths: { added: number; removed: number; changed: number };
  /** Endings whose block class got worse / better for the attacker, or moved to or from a state. */
  endings: { worse: number; better: number; other: number; shifts: ClassShift[] };
  hitOutcomesChanged: number;
  naturalCombos: { lost: number; gained: number };
  jails: { lost: number; gained: number };
}

const isStance = (graphs: readonly MoveGraph[], id: string) =>
  graphs.some((g) => g.nodes.some((n) => n.id === id && n.kind === "stance"));

/** Counts what a diff holds. The graphs tell moves from stances (a node id alone does not). */
export function summariseChanges(diff: GraphDiff, before: MoveGraph, after: MoveGraph): ChangeSummary {
  const graphs = [before, after];
  const split = (ids: string[]) => {
    const stances = ids.filter((id) => isStance(graphs, id)).length;
    return { moves: ids.length - stances, stances };
  };
  const added = split(diff.nodes.added);
  const removed = split(diff.nodes.removed);
  const changed = split(diff.nodes.changed.map((c) => c.id));

  const summary: ChangeSummary = {
    moves: { added: added.moves, removed: removed.moves, changed: changed.moves },
    stances: { added: added.stances, removed: removed.stances, changed: changed.stances },
    links: { added: diff.edges.added.length, removed: diff.edges.removed.length, changed: diff.edges.changed.length },
    paths: { added: 0, removed: 0, changed: 0 },
    endings: { worse: 0, better: 0, other: 0, shifts: [] },
    hitOutcomesChanged: 0,
    naturalCombos: { lost: 0, gained: 0 },
    jails: { lost: 0, gained: 0 },
  };
  const shifts = new Map<string, ClassShift>();
  for (const path of diff.paths) {
    summary.paths[path.status] += 1;
    for (const change of path.changes) {
      if (change.field === "blockClass") {
        const from = change.before as BlockClass;
        const to = change.after as BlockClass;
        const trend = blockClassTrend(from, to);
        if (trend > 0) summary.endings.worse += 1;
        else if (trend < 0) summary.endings.better += 1;
        else summary.endings.other += 1;
        const key = `${from}>${to}`;
        const shift = shifts.get(key);
        if (shift) shift.count += 1;
        else shifts.set(key, { from, to, count: 1 });
      } else if (change.field === "onHit") summary.hitOutcomesChanged += 1;
      else if (change.field === "naturalCombo") summary.naturalCombos[change.after === true ? "gained" : "lost"] += 1;
      else if (change.field === "jails") summary.jails[change.after === true ? "gained" : "lost"] += 1;
    }
  }
  // Most common shift first; ties in a fixed order so the sentence does not wobble.
  summary.endings.shifts = [...shifts.values()].sort(
    (a, b) => b.count - a.count || (a.from + a.to < b.from + b.to ? -1 : a.from + a.to > b.from + b.to ? 1 : 0),
  );
  return summary;
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** The summary as short phrases, most telling first; empty when nothing changed. */
export function summaryPhrases(s: ChangeSummary): string[] {
  const out: string[] = [];
  const moveCount = s.moves.added + s.moves.removed + s.moves.changed;
  if (s.moves.changed > 0) out.push(`${plural(s.moves.changed, "move", "moves")} changed`);
  if (s.moves.added > 0) out.push(`${plural(s.moves.added, "move", "moves")} added`);
  if (s.moves.removed > 0) out.push(`${plural(s.moves.removed, "move", "moves")} taken out`);
  const linkCount = s.links.added + s.links.removed + s.links.changed;
  if (linkCount > 0) out.push(`${plural(linkCount, "follow-up or cancel", "follow-ups or cancels")} changed`);
  const stanceCount = s.stances.added + s.stances.removed + s.stances.changed;
  if (stanceCount > 0) out.push(`${plural(stanceCount, "stance", "stances")} changed`);
  for (const shift of s.endings.shifts) {
    out.push(
      `${plural(shift.count, `ending that was ${shift.from} is`, `endings that were ${shift.from} are`)} now ${shift.to}`,
    );
  }
  if (s.hitOutcomesChanged > 0) out.push(`${plural(s.hitOutcomesChanged, "path", "paths")} with a new outcome on hit`);
  if (s.naturalCombos.lost > 0) out.push(`${plural(s.naturalCombos.lost, "natural combo", "natural combos")} lost`);
  if (s.naturalCombos.gained > 0)
    out.push(`${plural(s.naturalCombos.gained, "natural combo", "natural combos")} gained`);
  if (s.jails.lost > 0) out.push(`${plural(s.jails.lost, "path", "paths")} no longer jail`);
  if (s.jails.gained > 0) out.push(`${plural(s.jails.gained, "path", "paths")} now jail`);
  if (s.paths.added > 0) out.push(`${plural(s.paths.added, "new path", "new paths")}`);
  if (s.paths.removed > 0) out.push(`${plural(s.paths.removed, "path", "paths")} gone`);
  // Everything else said nothing about moves: say that the moves themselves stayed.
  if (out.length > 0 && moveCount === 0 && linkCount === 0 && stanceCount === 0) out.unshift("no move changed");
  return out;
}

/** What the table shows of one side of a path: the four compared fields (a field may be unknown past the budget). */
export type PathSide = Partial<Pick<PathResult, "blockClass" | "onHit" | "naturalCombo" | "jails">>;

/** One row of the changed-paths table, small enough to send thousands to the browser. */
export interface ChangedPathRow {
  /** The root move's key. */
  root: string;
  /** The edge keys joined with "|": the Explorer's `path` parameter. */
  path: string;
  input: string;
  status: PathChange["status"];
  /** Null on the side the path does not exist on. */
  before: PathSide | null;
  after: PathSide | null;
  /** The fields that differ, in the engine's order. */
  changed: string[];
}

const COMPARED = ["blockClass", "onHit", "naturalCombo", "jails"] as const;

const sideOf = (p: PathView): PathSide => ({
  blockClass: p.blockClass,
  onHit: p.onHit,
  naturalCombo: p.naturalCombo,
  jails: p.jails,
});

interface Wanted {
  /** The listed path that ends here, if one does. */
  path: PathChange | null;
  /** The next steps, by edge id, that lead to a listed path. */
  next: Map<string, Wanted>;
}

/**
 * The four fields of each listed path on one side, read by walking from each root only as far
 * as the listed paths go (a trie of their edge ids): a path that leads to none is not gone
 * past. At most `budget.left` paths are walked on this side; past it a path stays unknown.
 */
function sidesOf(paths: readonly PathChange[], graph: MoveGraph, options: ExploreOptions, budget: { left: number }) {
  const found = new Map<PathChange, PathSide>();
  const moves = new Set(graph.nodes.filter((n) => n.kind === "move").map((n) => n.id));
  const tries = new Map<string, Wanted>();
  const step = (from: Wanted, edge: string): Wanted => {
    let next = from.next.get(edge);
    if (next === undefined) from.next.set(edge, (next = { path: null, next: new Map() }));
    return next;
  };
  for (const p of paths) {
    if (!moves.has(p.root)) continue;
    let at = tries.get(p.root) ?? { path: null, next: new Map<string, Wanted>() };
    tries.set(p.root, at);
    for (const edge of p.edges) at = step(at, edge);
    at.path = p;
  }
  const compiled = compileGraph(graph);
  for (const [root, trie] of tries) {
    // here[i]: the trie node of the walk's path up to position i (undefined: no listed path goes that way).
    const here: (Wanted | undefined)[] = [];
    for (const walk of iteratePaths(compiled, root, options)) {
      if (budget.left-- <= 0) return found;
      const i = walk.length - 1;
      const at = (here[i] = i === 0 ? trie : here[i - 1]?.next.get(walk.edgeIdAt(i - 1)));
      if (at?.path) found.set(at.path, sideOf(walk));
      if (at === undefined || at.next.size === 0) walk.skipExtensions();
    }
  }
  return found;
}

/**
 * The diff's paths as table rows, with both sides' four fields. The diff lists only what
 * differs, so each side is walked again up to the listed paths to fill in the rest; past
 * `budget` paths walked on a side, a row keeps what the diff says and the rest stays unknown.
 */
export function changedPathRows(
  diff: GraphDiff,
  before: MoveGraph,
  after: MoveGraph,
  options: ExploreOptions,
  budget = 3_000_000,
): ChangedPathRow[] {
  const was = sidesOf(
    diff.paths.filter((p) => p.status !== "added"),
    before,
    options,
    { left: budget },
  );
  const now = sidesOf(
    diff.paths.filter((p) => p.status !== "removed"),
    after,
    options,
    { left: budget },
  );
  return diff.paths.map((p) => {
    const fromDiff = (side: "before" | "after"): PathSide =>
      Object.fromEntries(p.changes.map((c) => [c.field, c[side]])) as PathSide;
    return {
      root: p.root,
      path: p.edges.join("|"),
      input: p.input,
      status: p.status,
      before: p.status === "added" ? null : (was.get(p) ?? fromDiff("before")),
      after: p.status === "removed" ? null : (now.get(p) ?? fromDiff("after")),
      changed: COMPARED.filter((f) => p.changes.some((c) => c.field === f)),
    };
  });
}

/** What the paths table can be narrowed to: a field that changed, or a path on one side only. */
export const CHANGE_FILTERS = [
  "any",
  "blockClass",
  "onHit",
  "naturalCombo",
  "jails",
  "oneSide",
  "added",
  "removed",
] as const;
export type ChangeFilter = (typeof CHANGE_FILTERS)[number];
/** The columns the paths table sorts by. */
export const SORT_COLUMNS = ["input", "status", "blockClass", "onHit", "naturalCombo", "jails"] as const;
export type SortColumn = (typeof SORT_COLUMNS)[number];

/** Which changed paths the table shows, in what order, and which page of them: all of it in the address. */
export interface ChangedPathsView {
  change: ChangeFilter;
  /** Text the path's input contains (any case); empty: any. */
  q: string;
  /** null: the diff's order (root, then input). */
  sort: SortColumn | null;
  dir: "asc" | "desc";
  page: number;
}

/** The view from an address's search parameters; anything unreadable falls back to its default. */
export const changedPathsViewSchema = z.object({
  change: z.enum(CHANGE_FILTERS).catch("any").default("any"),
  q: z.string().max(100).catch("").default(""),
  sort: z.enum(SORT_COLUMNS).nullable().catch(null).default(null),
  dir: z.enum(["asc", "desc"]).catch("asc").default("asc"),
  page: z.coerce.number().int().min(1).max(100_000).catch(1).default(1),
});

export const DEFAULT_VIEW: ChangedPathsView = { change: "any", q: "", sort: null, dir: "asc", page: 1 };

/** The search parameters of a view, defaults left out, after the Editions compared. */
export function changesSearch(editions: { from: string; to: string }, view: ChangedPathsView): string {
  const params = new URLSearchParams({ from: editions.from, to: editions.to });
  if (view.change !== "any") params.set("change", view.change);
  if (view.q !== "") params.set("q", view.q);
  if (view.sort !== null) params.set("sort", view.sort);
  if (view.sort !== null && view.dir !== "asc") params.set("dir", view.dir);
  if (view.page > 1) params.set("page", String(view.page));
  return `?${params.toString()}`;
}

const matchesChange: Record<ChangeFilter, (r: ChangedPathRow) => boolean> = {
  any: () => true,
  blockClass: (r) => r.changed.includes("blockClass"),
  onHit: (r) => r.changed.includes("onHit"),
  naturalCombo: (r) => r.changed.includes("naturalCombo"),
  jails: (r) => r.changed.includes("jails"),
  oneSide: (r) => r.status !== "changed",
  added: (r) => r.status === "added",
  removed: (r) => r.status === "removed",
};

/** The side a row is sorted by: the new one, or the old one for a path that is gone. */
export const currentSide = (r: ChangedPathRow): PathSide => r.after ?? r.before ?? {};

/** Best ending first; a state after every number. */
const CLASS_ORDER: Record<BlockClass, number> = {
  plus: 0,
  even: 1,
  safe: 2,
  punishable: 3,
  "launch-punishable": 4,
  state: 5,
};
const STATUS_ORDER = { changed: 0, added: 1, removed: 2 } as const;
const byCodeUnits = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
const byFlag = (a: boolean, b: boolean) => Number(a) - Number(b);

/**
 * Per column: the value a row is sorted by (undefined: unknown, past the walk's budget) and
 * how two values compare, ascending. Flags go "no" before "yes"; on hit, as the engine orders outcomes.
 */
const SORTS: { [C in SortColumn]: { value: (r: ChangedPathRow) => unknown; compare: (a: never, b: never) => number } } =
  {
    input: { value: (r) => r.input, compare: byCodeUnits },
    status: { value: (r) => STATUS_ORDER[r.status], compare: (a: number, b: number) => a - b },
    blockClass: {
      value: (r) => currentSide(r).blockClass,
      compare: (a: BlockClass, b: BlockClass) => CLASS_ORDER[a] - CLASS_ORDER[b],
    },
    onHit: { value: (r) => currentSide(r).onHit, compare: compareOutcome },
    naturalCombo: { value: (r) => currentSide(r).naturalCombo, compare: byFlag },
    jails: { value: (r) => currentSide(r).jails, compare: byFlag },
  };

/**
 * One page of the changed paths under a view: filtered and sorted over every changed path, not
 * only those of one page, then cut into pages of `perPage`. Ties keep the diff's order (root,
 * then input), and rows whose value is unknown come last either way.
 */
export function viewChangedPaths(
  rows: readonly ChangedPathRow[],
  view: ChangedPathsView,
  perPage: number,
): { rows: ChangedPathRow[]; matching: number; page: number; pageCount: number } {
  const needle = view.q.trim().toLowerCase();
  const keep = matchesChange[view.change];
  let found = rows.filter((r) => keep(r) && (needle === "" || r.input.toLowerCase().includes(needle)));
  if (view.sort !== null) {
    const { value, compare } = SORTS[view.sort] as {
      value: (r: ChangedPathRow) => unknown;
      compare: (a: unknown, b: unknown) => number;
    };
    const sign = view.dir === "desc" ? -1 : 1;
    const keyed = found.map((row) => ({ row, value: value(row) }));
    // Array sort is stable: equal values keep the diff's order.
    keyed.sort((a, b) =>
      a.value === undefined || b.value === undefined
        ? Number(a.value === undefined) - Number(b.value === undefined)
        : sign * compare(a.value, b.value),
    );
    found = keyed.map((k) => k.row);
  }
  const pageCount = Math.max(1, Math.ceil(found.length / perPage));
  const page = Math.min(view.page, pageCount);
  return { rows: found.slice((page - 1) * perPage, page * perPage), matching: found.length, page, pageCount };
}

/** How the page names a field of a move, stance or link. */
export const FIELD_LABEL: Readonly<Record<string, string>> = {
  input: "input",
  name: "name",
  level: "hit level",
  damage: "damage",
  startup: "startup",
  onBlock: "on block",
  onHit: "on hit",
  onCounterHit: "on counter hit",
  range: "range",
  tags: "tags",
  notes: "notes",
  kind: "kind",
  from: "from",
  to: "to",
  gapOnBlock: "gap on block",
  comboOnHit: "combos on hit",
  comboOnCounterHit: "combos on counter hit",
  autoGuard: "auto-guard",
  blockClass: "block class",
  naturalCombo: "natural combo",
  jails: "jails",
};

const OUTCOME_FIELDS = new Set(["onBlock", "onHit", "onCounterHit"]);

/** A field's value in words: outcomes as the move list writes them, flags as yes/no, lists joined. */
export function formatFieldValue(field: string, value: unknown): string {
  if (value === null || value === undefined) return "—";
  if (OUTCOME_FIELDS.has(field) && (typeof value === "number" || typeof value === "object"))
    return formatOutcome(value as PathResult["onBlock"]);
  if (typeof value === "boolean") return value ? "yes" : "no";
  if (Array.isArray(value)) return value.length === 0 ? "none" : value.map(String).join(", ");
  if (typeof value === "string") return value === "" ? "(empty)" : value;
  if (typeof value === "number") return String(value);
  return JSON.stringify(value);
}

/** The Editions a comparison may use, newest first, with the one asked for or the default on each side. */
export function pickEditions<E extends { slug: string }>(
  editions: readonly E[],
  wanted: { from?: string; to?: string },
): { from: E | null; to: E | null; unknown: string[] } {
  const unknown: string[] = [];
  const find = (slug: string | undefined) => {
    if (slug === undefined) return undefined;
    const found = editions.find((e) => e.slug === slug);
    if (!found) unknown.push(slug);
    return found;
  };
  const to = find(wanted.to) ?? editions[0] ?? null;
  // By default, the Edition just before `to`: what that patch changed.
  const toIndex = to === null ? -1 : editions.indexOf(to);
  const from = find(wanted.from) ?? editions[toIndex + 1] ?? (toIndex > 0 ? editions[0] : undefined) ?? null;
  return { from, to, unknown };
}
