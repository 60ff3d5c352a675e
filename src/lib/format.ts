import type { BlockClass, Outcome } from "./engine";

/** `+3`, `0`, `-12`: the sign is always written, as frame advantage is read. */
export function formatFrames(n: number): string {
  return n > 0 ? `+${n}` : String(n);
}

/** A number, or a state with its number when it carries one: `knockdown +3`. */
export function formatOutcome(o: Outcome): string {
  if (typeof o === "number") return formatFrames(o);
  return o.frames === undefined ? o.state : `${o.state} ${formatFrames(o.frames)}`;
}

export function outcomeNumber(o: Outcome): number | null {
  return typeof o === "number" ? o : null;
}

/** The block class as the UI writes it beside its colour. */
export const BLOCK_CLASS_WORD: Record<BlockClass, string> = {
  plus: "plus",
  even: "even",
  safe: "safe",
  punishable: "punishable",
  "launch-punishable": "launch punish",
  state: "state",
};
