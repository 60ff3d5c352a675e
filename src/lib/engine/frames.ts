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
