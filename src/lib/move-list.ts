import { z } from "zod";
import type { CancelEntry, MoveEntry, MoveList } from "./dto";
import {
  classifyBlock,
  compareBlockClass,
  compareStartup,
  framesSaved,
  guardsFor,
  LEVELS,
  reachesAt,
  startupWithin,
  type BlockClass,
  type BlockRules,
  type Level,
} from "./engine";
import { BLOCK_CLASSES } from "./paths-filter";

/** A hit of a string: what it adds to the input, and what stopping there leaves. */
export interface HitStep {
  kind: "hit";
  move: MoveEntry;
  /** What this step adds to the input: the root's whole input, then `,2`, `,1+2`… */
  input: string;
  /** 0 for the string's first hit; a cancel or follow-up one deeper than the hit it comes from. */
  depth: number;
  /** The damage of the hits up to and including this one. */
  damage: number;
  blockClass: BlockClass;
  /** Two or more follow-ups from here that take different guards: the defender must guess. */
  guessPoint: boolean;
}

/** A stance cancel out of a hit: its own ending, and the frames it saves over stopping at the hit. */
export interface CancelStep {
  kind: "cancel";
  cancel: CancelEntry;
  from: MoveEntry;
  input: string;
  depth: number;
  blockClass: BlockClass;
  framesSaved: number | null;
}

export type Step = HitStep | CancelStep;

/** How many of a string's endings leave this block class, by stopping at a hit or by a cancel. */
export interface EndingCount {
  blockClass: BlockClass;
  viaCancel: boolean;
  count: number;
}

/** One string of the move list: its first hit, its steps, and its endings summed up by class. */
export interface StringRow {
  root: MoveEntry;
  /** `neutral`, or `stance-<key>` for a string done from a stance. */
  section: string;
  /** The first hit, then depth first in list order; each hit's cancels right after it. */
  steps: Step[];
  /** The hits along the first follow-up at each hit: the string as it is usually entered. */
  mainLine: MoveEntry[];
  /** Every hit level in the string, in order of first appearance. */
  levels: Level[];
  /** Best class first; at a hit before by a cancel. */
  endings: EndingCount[];
  bestEnding: BlockClass;
  /** The first hit's startup. */
  startup: number | null;
  /** The most damage one way through the string deals. */
  bestDamage: number;
}

export const NEUTRAL_SECTION = "neutral";
export const stanceSection = (key: string) => `stance-${key}`;

/** Whether the follow-ups of a hit ask for different guards, so the defender has to guess. */
function isGuessPoint(children: readonly MoveEntry[]): boolean {
  return new Set(children.map((c) => guardsFor(c.level).join(" "))).size > 1;
}

/** A character's moves and cancels as strings: one row per first hit (a neutral starter or a stance move). */
export function stringRows(list: MoveList, rules: BlockRules): StringRow[] {
  const byId = new Map(list.moves.map((m) => [m.id, m]));
  const childrenOf = new Map<number, MoveEntry[]>();
  const cancelsOf = new Map<number, CancelEntry[]>();
  const isRoot = (m: MoveEntry) => m.via?.kind !== "follow" || !byId.has(m.via.fromId);
  for (const m of list.moves) {
    if (!isRoot(m) && m.via?.kind === "follow") {
      childrenOf.set(m.via.fromId, [...(childrenOf.get(m.via.fromId) ?? []), m]);
    }
  }
  for (const c of list.cancels) cancelsOf.set(c.fromId, [...(cancelsOf.get(c.fromId) ?? []), c]);

  const placed = new Set<number>();
  const build = (root: MoveEntry): StringRow => {
    const steps: Step[] = [];
    const visit = (m: MoveEntry, depth: number, before: number) => {
      if (placed.has(m.id)) return;
      placed.add(m.id);
      const children = childrenOf.get(m.id) ?? [];
      const damage = before + m.damage;
      steps.push({
        kind: "hit",
        move: m,
        input: depth === 0 || m.via === null ? m.input : m.via.input,
        depth,
        damage,
        blockClass: classifyBlock(m.onBlock, rules),
        guessPoint: isGuessPoint(children),
      });
      for (const c of cancelsOf.get(m.id) ?? []) {
        steps.push({
          kind: "cancel",
          cancel: c,
          from: m,
          input: c.input,
          depth: depth + 1,
          blockClass: classifyBlock(c.onBlock, rules),
          framesSaved: framesSaved(c.onBlock, m.onBlock),
        });
      }
      for (const child of children) visit(child, depth + 1, damage);
    };
    visit(root, 0, 0);

    const mainLine: MoveEntry[] = [root];
    for (
      let next = childrenOf.get(root.id)?.[0];
      next && !mainLine.includes(next);
      next = childrenOf.get(next.id)?.[0]
    ) {
      mainLine.push(next);
    }

    const counts = new Map<string, EndingCount>();
    for (const s of steps) {
      const viaCancel = s.kind === "cancel";
      const id = `${s.blockClass} ${viaCancel}`;
      const known = counts.get(id);
      if (known) known.count += 1;
      else counts.set(id, { blockClass: s.blockClass, viaCancel, count: 1 });
    }
    const endings = [...counts.values()].sort(
      (a, b) => compareBlockClass(a.blockClass, b.blockClass) || Number(a.viaCancel) - Number(b.viaCancel),
    );
    const hits = steps.filter((s): s is HitStep => s.kind === "hit");
    return {
      root,
      section: root.stance ? stanceSection(root.stance.key) : NEUTRAL_SECTION,
      steps,
      mainLine,
      levels: [...new Set(hits.map((h) => h.move.level))],
      endings,
      bestEnding: endings[0]?.blockClass ?? "state",
      startup: root.startup,
      bestDamage: Math.max(...hits.map((h) => h.damage)),
    };
  };

  const rows = list.moves.filter(isRoot).map(build);
  // A follow-up whose chain of follow-ups never reaches a first hit (a loop) still gets a row.
  for (const m of list.moves) if (!placed.has(m.id)) rows.push(build(m));
  return rows;
}

// The view: filters and order, kept in the address.

export const SORTS = ["list", "startup", "damage", "ending"] as const;
export type MoveListSort = (typeof SORTS)[number];

export interface MoveListView {
  level: Level | "any";
  ending: BlockClass | "any";
  /** `any`, `neutral` or a stance's key. */
  stance: string;
  startupFrom: number | null;
  startupTo: number | null;
  /** In a game that measures range in numbers: only strings whose first hit reaches this far. */
  reach: number | null;
  sort: MoveListSort;
  dir: "asc" | "desc";
}

export const DEFAULT_MOVE_LIST_VIEW: MoveListView = {
  level: "any",
  ending: "any",
  stance: "any",
  startupFrom: null,
  startupTo: null,
  reach: null,
  sort: "list",
  dir: "asc",
};

const frameCount = z.coerce.number().int().min(0).max(999).nullable().catch(null).default(null);
/** A distance in the game's unit of range. */
export const distanceSchema = z.coerce.number().finite().min(0).max(999.99).nullable().catch(null).default(null);

/** A distance typed in a field or read from the address; null for nothing, an empty field or anything unreadable. */
export function readDistance(value: unknown): number | null {
  return typeof value === "string" && value.trim() !== "" ? distanceSchema.parse(value) : null;
}

/** The view from an address's search parameters; anything unreadable falls back to its default. */
export const moveListViewSchema = z.object({
  level: z
    .enum(["any", ...LEVELS])
    .catch("any")
    .default("any"),
  ending: z
    .enum(["any", ...BLOCK_CLASSES])
    .catch("any")
    .default("any"),
  stance: z
    .string()
    .regex(/^[A-Za-z0-9_.:-]{1,64}$/)
    .catch("any")
    .default("any"),
  startupFrom: frameCount,
  startupTo: frameCount,
  reach: distanceSchema,
  sort: z.enum(SORTS).catch("list").default("list"),
  dir: z.enum(["asc", "desc"]).catch("asc").default("asc"),
});

/** The view read from URLSearchParams (or a page's search params made flat). */
export function readMoveListView(params: URLSearchParams): MoveListView {
  const flat = Object.fromEntries([...params.entries()].filter(([, v]) => v !== ""));
  return moveListViewSchema.parse(flat);
}

/** The address's search for a view, defaults left out, keeping other parameters (the Edition). */
export function moveListSearch(current: URLSearchParams, view: MoveListView): string {
  const params = new URLSearchParams(current);
  for (const k of Object.keys(DEFAULT_MOVE_LIST_VIEW)) params.delete(k);
  if (view.level !== "any") params.set("level", view.level);
  if (view.ending !== "any") params.set("ending", view.ending);
  if (view.stance !== "any") params.set("stance", view.stance);
  if (view.startupFrom !== null) params.set("startupFrom", String(view.startupFrom));
  if (view.startupTo !== null) params.set("startupTo", String(view.startupTo));
  if (view.reach !== null) params.set("reach", String(view.reach));
  if (view.sort !== "list") params.set("sort", view.sort);
  if (view.sort !== "list" && view.dir !== "asc") params.set("dir", view.dir);
  const search = params.toString();
  return search === "" ? "" : `?${search}`;
}

export function hasMoveListFilters(view: MoveListView): boolean {
  return (
    view.level !== "any" ||
    view.ending !== "any" ||
    view.stance !== "any" ||
    view.startupFrom !== null ||
    view.startupTo !== null ||
    view.reach !== null
  );
}

/**
 * Whether a string passes the filters: a hit of the level, an ending of the class, its stance, its
 * first hit's startup, and its first hit reaching the distance (a string starts only if it connects).
 */
export function matchesView(row: StringRow, view: MoveListView): boolean {
  return (
    (view.level === "any" || row.levels.includes(view.level)) &&
    (view.ending === "any" || row.endings.some((e) => e.blockClass === view.ending)) &&
    (view.stance === "any" ||
      (view.stance === NEUTRAL_SECTION
        ? row.section === NEUTRAL_SECTION
        : row.section === stanceSection(view.stance))) &&
    startupWithin(row.startup, view.startupFrom, view.startupTo) &&
    (view.reach === null || reachesAt(row.root.range, view.reach))
  );
}

const ORDER: Record<Exclude<MoveListSort, "list">, (a: StringRow, b: StringRow) => number> = {
  startup: (a, b) => compareStartup(a.startup, b.startup),
  damage: (a, b) => a.bestDamage - b.bestDamage,
  ending: (a, b) => compareBlockClass(a.bestEnding, b.bestEnding),
};

/**
 * The strings the view keeps in its order, ties in list order: ascending is fastest first, least
 * damage first, best ending first; `desc` turns it round. `list` keeps the list's order.
 */
export function viewStrings(rows: readonly StringRow[], view: MoveListView): StringRow[] {
  const kept = rows.filter((r) => matchesView(r, view));
  if (view.sort === "list") return kept;
  const order = ORDER[view.sort];
  const sign = view.dir === "desc" ? -1 : 1;
  return kept
    .map((row, i) => ({ row, i }))
    .sort((a, b) => sign * order(a.row, b.row) || a.i - b.i)
    .map((x) => x.row);
}

/** "2 safe", "1 plus via cancel": an ending count as the list writes it. */
export function endingLabel(e: EndingCount, word: string): string {
  return `${e.count} ${word}${e.viaCancel ? " via cancel" : ""}`;
}
