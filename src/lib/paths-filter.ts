import type { BlockClass, Outcome, PathView, StateName } from "./engine";

// The order of outcomes is a frame rule: the engine's, offered here beside the filters that use it.
export { compareOutcome } from "./engine";

/** What the on-hit filter can ask for: any number, or one state by name. */
export type OnHitKind = "numeric" | StateName;

export interface PathFilters {
  blockClass: BlockClass | "any";
  /** Paths dealing less than this are hidden; `null` keeps every path. */
  minDamage: number | null;
  onHit: OnHitKind | "any";
  stanceOnly: boolean;
  naturalOnly: boolean;
}

export const NO_FILTERS: PathFilters = {
  blockClass: "any",
  minDamage: null,
  onHit: "any",
  stanceOnly: false,
  naturalOnly: false,
};

export const BLOCK_CLASSES: readonly BlockClass[] = [
  "plus",
  "even",
  "safe",
  "punishable",
  "launch-punishable",
  "state",
];
export const ON_HIT_KINDS: readonly OnHitKind[] = ["numeric", "knockdown", "launch", "wall-splat", "crumple", "throw"];

export function outcomeKind(o: Outcome): OnHitKind {
  return typeof o === "number" ? "numeric" : o.state;
}

export function hasFilters(f: PathFilters): boolean {
  return f.blockClass !== "any" || f.minDamage !== null || f.onHit !== "any" || f.stanceOnly || f.naturalOnly;
}

/** The paths that pass every filter, in their original order (the walk's order). */
export function filterPaths<P extends PathView>(paths: readonly P[], f: PathFilters): P[] {
  // Up to 20,000 paths are filtered on every keystroke: return the same list when nothing filters.
  if (!hasFilters(f)) return paths as P[];
  const min = f.minDamage;
  return paths.filter(
    (p) =>
      (f.blockClass === "any" || p.blockClass === f.blockClass) &&
      (min === null || p.damage >= min) &&
      (f.onHit === "any" || outcomeKind(p.onHit) === f.onHit) &&
      (!f.stanceOnly || p.endsIn === "stance") &&
      (!f.naturalOnly || p.naturalCombo),
  );
}

/** An outcome as a sort key: its number, or `undefined` for a state so a table can keep states last in either direction. */
export function outcomeSortValue(o: Outcome): number | undefined {
  return typeof o === "number" ? o : undefined;
}
