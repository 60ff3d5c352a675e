import type { BlockClass, DefenderStance, FollowUpClass, Guard, Level, Outcome } from "./types";

export const DEFAULT_FASTEST = 10;
export const DEFAULT_LAUNCH_AT = 15;

/** The guards that stop a hit of each level. Shared and frozen: copy before handing out. */
export const GUARDS: Readonly<Record<Level, readonly Guard[]>> = Object.freeze({
  high: Object.freeze(["stand", "duck"] as Guard[]),
  mid: Object.freeze(["stand"] as Guard[]),
  low: Object.freeze(["crouch"] as Guard[]),
  "special-mid": Object.freeze(["stand", "crouch"] as Guard[]),
  throw: Object.freeze(["break"] as Guard[]),
  unblockable: Object.freeze(["evade"] as Guard[]),
});

export function guardsFor(level: Level): Guard[] {
  return GUARDS[level].slice();
}

/** The frame number of an outcome, or NaN for a state, so comparisons with it are false. */
export function outcomeFrames(outcome: Outcome): number {
  return typeof outcome === "number" ? outcome : Number.NaN;
}

export function classifyFrames(a: number, fastest: number, launchAt: number): BlockClass {
  if (a !== a) return "state";
  if (a >= 1) return "plus";
  if (a === 0) return "even";
  if (a > -fastest) return "safe";
  if (a > -launchAt) return "punishable";
  return "launch-punishable";
}

export function classifyBlock(
  onBlock: Outcome,
  { fastest = DEFAULT_FASTEST, launchAt = DEFAULT_LAUNCH_AT }: { fastest?: number; launchAt?: number } = {},
): BlockClass {
  return classifyFrames(outcomeFrames(onBlock), fastest, launchAt);
}

/**
 * Frames a stance cancel saves on block: the cancel's advantage minus the advantage of
 * stopping at the hit it ends (`cancel.onBlock - lastMove.onBlock`). Null unless both are
 * numbers. Negative when the cancel leaves you worse off.
 */
export function framesSaved(cancelOnBlock: Outcome, moveOnBlock: Outcome): number | null {
  const saved = framesSavedBetween(outcomeFrames(cancelOnBlock), outcomeFrames(moveOnBlock));
  return saved === saved ? saved : null;
}

/** framesSaved on frame numbers: `cancelAdvantage - moveAdvantage`, NaN when either is NaN (a state). */
export function framesSavedBetween(cancelAdvantage: number, moveAdvantage: number): number {
  return cancelAdvantage - moveAdvantage;
}

/**
 * The gap on block before a follow-up of startup `s` done at advantage `a`: `s - a - 1`
 * frames in which a defender move of that startup or less hits first (`<= 0`: it jails).
 * NaN when either is NaN (a state advantage or no startup): no gap is known.
 */
export function gapAtAdvantage(advantage: number, startup: number): number {
  return startup - advantage - 1;
}

/** Whether a follow-up of startup `s` combos at on-hit advantage `a`: `s <= a`. False for NaN (a state). */
export function combosAtAdvantage(advantage: number, startup: number): boolean {
  return startup <= advantage;
}

/**
 * A stance move done right after a cancel is a follow-up at the cancel's advantage: its
 * gap on block (null for a state outcome or no startup) and whether it combos on hit and
 * on counter hit.
 */
export function afterCancel(
  cancel: { onBlock: Outcome; onHit: Outcome; onCounterHit: Outcome },
  startup: number | null | undefined,
): { gapOnBlock: number | null; comboOnHit: boolean; comboOnCounterHit: boolean } {
  const s = startup ?? Number.NaN;
  const gap = gapAtAdvantage(outcomeFrames(cancel.onBlock), s);
  return {
    gapOnBlock: gap === gap ? gap : null,
    comboOnHit: combosAtAdvantage(outcomeFrames(cancel.onHit), s),
    comboOnCounterHit: combosAtAdvantage(outcomeFrames(cancel.onCounterHit), s),
  };
}

export function followUp(
  advantage: number,
  startup: number,
  { fastest = DEFAULT_FASTEST }: { fastest?: number } = {},
): FollowUpClass {
  if (startup <= advantage) return "guaranteed";
  if (startup < advantage + fastest) return "frame-trap";
  return "interruptible";
}

export function defenderStanceAfter(lastLevel: Level): DefenderStance {
  return lastLevel === "low" ? "crouching" : "standing";
}

export interface PunisherMove {
  id: string;
  startup: number;
  damage: number;
  from: "standing" | "crouching" | "any";
}

/**
 * The defender's moves that land before the attacker recovers, best damage first and,
 * among equal damage, the faster (more reliable) move first.
 */
export function punishersFor<M extends PunisherMove>(
  onBlock: Outcome,
  defenderStance: DefenderStance,
  moves: readonly M[],
): M[] {
  const a = outcomeFrames(onBlock);
  if (!(a < 0)) return [];
  return moves
    .filter((m) => m.startup <= -a && (m.from === "any" || m.from === defenderStance))
    .sort((x, y) => y.damage - x.damage || x.startup - y.startup);
}
