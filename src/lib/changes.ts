import {
  blockClassTrend,
  explorePathsLimited,
  formatOutcome,
  type BlockClass,
  type ExploreOptions,
  type GraphDiff,
  type MoveGraph,
  type PathChange,
  type PathResult,
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

const sideOf = (p: PathResult): PathSide => ({
  blockClass: p.blockClass,
  onHit: p.onHit,
  naturalCombo: p.naturalCombo,
  jails: p.jails,
});

/**
 * The diff's paths as table rows, with both sides' four fields. The diff lists only what
 * differs, so each root with listed paths is explored again on each side to fill in the rest;
 * past `budget` paths explored in all, a row keeps what the diff says and the rest stays unknown.
 */
export function changedPathRows(
  diff: GraphDiff,
  before: MoveGraph,
  after: MoveGraph,
  options: ExploreOptions,
  budget = 50_000,
): ChangedPathRow[] {
  const roots = [...new Set(diff.paths.map((p) => p.root))];
  let left = budget;
  const explore = (graph: MoveGraph) => {
    const found = new Map<string, PathSide>();
    const moves = new Set(graph.nodes.filter((n) => n.kind === "move").map((n) => n.id));
    for (const root of roots) {
      if (!moves.has(root) || left <= 0) continue;
      const { paths } = explorePathsLimited(graph, root, left, options);
      left -= paths.length;
      for (const p of paths) found.set(`${root}\u0000${p.edges.join("|")}`, sideOf(p));
    }
    return found;
  };
  const was = explore(before);
  const now = explore(after);
  return diff.paths.map((p) => {
    const path = p.edges.join("|");
    const key = `${p.root}\u0000${path}`;
    const fromDiff = (side: "before" | "after"): PathSide =>
      Object.fromEntries(p.changes.map((c) => [c.field, c[side]])) as PathSide;
    return {
      root: p.root,
      path,
      input: p.input,
      status: p.status,
      before: p.status === "added" ? null : (was.get(key) ?? fromDiff("before")),
      after: p.status === "removed" ? null : (now.get(key) ?? fromDiff("after")),
      changed: COMPARED.filter((f) => p.changes.some((c) => c.field === f)),
    };
  });
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
