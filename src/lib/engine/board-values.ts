import { isPressColumn } from "./board-fill";
import { advantageSide, explainGap, formatOutcome, outcomeFrames } from "./frames";
import type { CellBasis, Outcome, ValueTable } from "./types";

/**
 * What a filled cell is worth, in damage points to the attacker (DESIGN.md, "Mix-up board"):
 * the trade rules that turn the engine's facts about an exchange (a `CellBasis`) into a
 * payoff through a board's value table, and the sentence that says how.
 */

/**
 * Framefork's own defaults, an estimate and not taken from any source: a frame either way is
 * worth one point, a launch nearly a combo's damage, a whiff's free answer a strong hit. A
 * coach changes them per board.
 */
export const DEFAULT_VALUE_TABLE: ValueTable = Object.freeze({
  plusFrame: 1,
  minusFrame: 1,
  states: Object.freeze({ knockdown: 10, launch: 35, "wall-splat": 25, crumple: 30, throw: 0 }),
  whiff: 20,
}) as ValueTable;

/**
 * What leaving an outcome is worth to the attacker: a state its value in the table (a number
 * the state carries is not counted), a frame count its frames times `plusFrame` when ahead and
 * times `minusFrame` (a cost) when behind.
 */
export function outcomeValue(outcome: Outcome, values: ValueTable): number {
  if (typeof outcome !== "number") return values.states[outcome.state];
  switch (advantageSide(outcome)) {
    case "attacker":
      return outcomeFrames(outcome) * values.plusFrame;
    case "defender":
      return outcomeFrames(outcome) * values.minusFrame;
    default:
      return 0;
  }
}

/**
 * The attacker's payoff of one exchange:
 * - blocked: minus the punisher's damage when one applies, else the value of the block outcome
 *   (a blocked hit that leaves a state, which is unusual, is valued as the state);
 * - hit: the hit's damage plus the value of the outcome it leaves;
 * - whiff: minus the table's whiff cost;
 * - interrupted: minus the interrupting move's damage.
 */
export function cellPayoff(basis: CellBasis, values: ValueTable): number {
  switch (basis.kind) {
    case "blocked":
      return basis.punisher !== null ? -basis.punisher.damage : outcomeValue(basis.onBlock, values);
    case "hit":
      return basis.damage + outcomeValue(basis.outcome, values);
    case "whiff":
      return -values.whiff;
    case "interrupted":
      return -basis.interrupt.damage;
  }
}

/** A payoff as the board writes it: sign always shown, at most two decimals. */
export function formatPayoff(n: number): string {
  const r = Math.round(n * 100) / 100;
  if (r === 0) return "0";
  return r > 0 ? `+${r}` : String(r);
}

/** What a frame count is worth: "the 4 frames ahead are worth 1 each". */
function explainFramesValue(frames: number, values: ValueTable): string {
  const n = Math.abs(frames);
  switch (advantageSide(frames)) {
    case "attacker":
      return `the ${n} frames ahead are worth ${values.plusFrame} each`;
    case "defender":
      return `the ${n} frames behind cost ${values.minusFrame} each`;
    default:
      return "neither side is ahead";
  }
}

/** What an outcome left after a hit is worth: "+4; the 4 frames ahead are worth 1 each", "knockdown, worth 10". */
function explainOutcomeValue(outcome: Outcome, values: ValueTable): string {
  if (typeof outcome !== "number") return `${formatOutcome(outcome)}, worth ${values.states[outcome.state]}`;
  return `${formatOutcome(outcome)}; ${explainFramesValue(outcome, values)}`;
}

/**
 * Where a cell's number comes from, in one sentence. `column` is the label of the cell's
 * defender option when known ("Stand guard"); with it the sentence names the guard, and a
 * blocked cell in a press column (a string that stops there) says that pressing is guarding.
 */
export function explainCell(basis: CellBasis, values: ValueTable, column?: string): string {
  const total = formatPayoff(cellPayoff(basis, values));
  const { input } = basis;
  switch (basis.kind) {
    case "blocked": {
      const lead =
        column === undefined
          ? `${input} is blocked`
          : isPressColumn(column)
            ? `Pressing when the string stops at ${input} is guarding (${column}): it is blocked`
            : `${column} blocks ${input}`;
      const at = `${lead} at ${formatOutcome(basis.onBlock)}`;
      const p = basis.punisher;
      if (p !== null) {
        return `${at}; the opponent's ${p.input} (${p.startup}f, ${p.damage} damage) punishes it from ${basis.defenderStance}: ${total}.`;
      }
      if (typeof basis.onBlock !== "number") {
        return `${lead}, which leaves the defender in ${formatOutcome(basis.onBlock)}, worth ${values.states[basis.onBlock.state]}: ${total}.`;
      }
      const unpunished =
        advantageSide(basis.onBlock) === "defender"
          ? `no move of the opponent's punishes it from ${basis.defenderStance}, and `
          : "";
      return `${at}; ${unpunished}${explainFramesValue(basis.onBlock, values)}: ${total}.`;
    }
    case "hit": {
      const lead =
        column === undefined
          ? `${input} ${basis.counterHit ? "lands as a counter hit" : "hits"}`
          : basis.counterHit
            ? `${column} does not fit before ${input}, which lands as a counter hit`
            : `${column} does not stop ${input}, which hits`;
      return `${lead} for ${basis.damage} damage and leaves ${explainOutcomeValue(basis.outcome, values)}: ${total}.`;
    }
    case "whiff":
      return `${column ?? "The guard"} ducks the high ${input} and the attacker whiffs, which costs ${values.whiff}: ${total}.`;
    case "interrupted": {
      const m = basis.interrupt;
      return `The opponent's ${m.input} (${m.startup}f) hits first in the gap before ${input} (${explainGap(basis.gap)}), for ${m.damage} damage: ${total}.`;
    }
  }
}
