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

/** Block classes from best to worst for the attacker; `state` has no rank (a knockdown is not "safer" than -5). */
const BLOCK_CLASS_RANK: Partial<Record<BlockClass, number>> = {
  plus: 0,
  even: 1,
  safe: 2,
  punishable: 3,
  "launch-punishable": 4,
};

/** -1: the new class is better for the attacker, 1: worse, 0: neither is a number's class. */
export function blockClassTrend(before: BlockClass, after: BlockClass): -1 | 0 | 1 {
  const a = BLOCK_CLASS_RANK[before];
  const b = BLOCK_CLASS_RANK[after];
  if (a === undefined || b === undefined || a === b) return 0;
  return b > a ? 1 : -1;
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
  if (combosAtAdvantage(advantage, startup)) return "guaranteed";
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

/** Whether a defender move done from `from` can be done from `defenderStance`. */
export function canActFrom(from: PunisherMove["from"], defenderStance: DefenderStance): boolean {
  return from === "any" || from === defenderStance;
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
  const limit = punishWindow(onBlock);
  if (limit === null) return [];
  return moves.filter((m) => m.startup <= limit && canActFrom(m.from, defenderStance)).sort(byDamageThenSpeed);
}

// ---------------------------------------------------------------------------------------
// More frame rules the UI needs, and every figure in words. Each sentence that says why a
// figure is what it is lives here, beside the rule it explains, so the two change together.

/** The thresholds the block classes are read with. */
export interface BlockRules {
  fastest: number;
  launchAt: number;
}

/**
 * The launch threshold in force: a launching punish is never faster than the opponent's
 * fastest attack, so a `launchAt` below `fastest` counts as `fastest`.
 */
export function effectiveLaunchAt(launchAt: number, fastest: number): number {
  return Math.max(launchAt, fastest);
}

/** The highest defender startup that punishes an ending: `-a` at `a < 0` on block; null when nothing can. */
export function punishWindow(onBlock: Outcome): number | null {
  const a = outcomeFrames(onBlock);
  return a < 0 ? -a : null;
}

/** Best damage first and, among equal damage, the faster (more reliable) move first. */
export function byDamageThenSpeed(x: { damage: number; startup: number }, y: { damage: number; startup: number }) {
  return y.damage - x.damage || x.startup - y.startup;
}

/** Whether a gap on block jails: at `<= 0` a blocking defender cannot act before the next hit. */
export function gapJails(gap: number): boolean {
  return gap <= 0;
}

/** A known gap of 1 frame or more: the defender may act there, and a high after it can be ducked. False for NaN. */
export function gapOpens(gap: number): boolean {
  return gap > 0;
}

/** Whether a defender move of this startup hits first in a gap on block: the gap opens and the startup fits in it. */
export function hitsFirstInGap(startup: number, gap: number): boolean {
  return gapOpens(gap) && startup <= gap;
}

/** Who acts first after an exchange with this outcome; `state` when it is not a frame count. */
export type AdvantageSide = "attacker" | "even" | "defender" | "state";

export function advantageSide(outcome: Outcome): AdvantageSide {
  const a = outcomeFrames(outcome);
  if (a > 0) return "attacker";
  if (a < 0) return "defender";
  return a === 0 ? "even" : "state";
}

/**
 * Ascending frame advantage with every state after every number: a state has no place on the
 * number line, so it is kept out of the way. States among themselves go by name, then by the
 * number they carry (a state without one first).
 */
export function compareOutcome(a: Outcome, b: Outcome): number {
  const an = typeof a === "number";
  const bn = typeof b === "number";
  if (an && bn) return a - b;
  if (an) return -1;
  if (bn) return 1;
  if (a.state !== b.state) return a.state < b.state ? -1 : 1;
  if (a.frames === b.frames) return 0;
  if (a.frames === undefined) return -1;
  if (b.frames === undefined) return 1;
  return a.frames - b.frames;
}

/** `+3`, `0`, `-12`: the sign is always written, as frame advantage is read. */
export function formatFrames(n: number): string {
  return n > 0 ? `+${n}` : String(n);
}

/** A number, or a state with its number when it carries one: `knockdown +3`. */
export function formatOutcome(o: Outcome): string {
  if (typeof o === "number") return formatFrames(o);
  return o.frames === undefined ? o.state : `${o.state} ${formatFrames(o.frames)}`;
}

/** What an outcome means after the exchange: "the attacker acts 3 frames before the defender". */
export function explainAdvantage(o: Outcome): string {
  if (typeof o !== "number") {
    return `the defender is left in ${o.state}${o.frames === undefined ? "" : ` at ${formatFrames(o.frames)} frames`}`;
  }
  if (o === 0) return "both sides act at once";
  return `the attacker acts ${Math.abs(o)} frames ${o > 0 ? "before" : "after"} the defender`;
}

/** The hover of a path's on-hit or on-counter-hit figure: the figure and who acts first after it. */
export function explainOnHit(o: Outcome, { counterHit = false }: { counterHit?: boolean } = {}): string {
  return `If the last hit lands${counterHit ? " as a counter hit" : ""}: ${formatOutcome(o)}, ${explainAdvantage(o)}.`;
}

/** The block class as the UI writes it beside its colour (the legend's word too). */
export const BLOCK_CLASS_WORD: Readonly<Record<BlockClass, string>> = Object.freeze({
  plus: "plus",
  even: "even",
  safe: "safe",
  punishable: "punishable",
  "launch-punishable": "launch-punishable",
  state: "state",
});

/** The on-block range of a class under the given rules: "-10 or less, above -15". */
export function blockClassRange(cls: BlockClass, { fastest, launchAt }: BlockRules): string {
  switch (cls) {
    case "plus":
      return "+1 or more";
    case "even":
      return "0";
    case "safe":
      return `below 0, above -${fastest}`;
    case "punishable":
      return `-${fastest} or less, above -${launchAt}`;
    case "launch-punishable":
      return `-${launchAt} or less`;
    case "state":
      return "a state, not a frame count";
  }
}

/** What a class means for the attacker; with the ending's on-block figure when it makes it exact. */
export function blockClassMeaning(cls: BlockClass, rules: BlockRules, onBlock?: Outcome): string {
  const limit = onBlock === undefined ? null : punishWindow(onBlock);
  const lands = limit === null ? "" : `; any defender move of startup ${limit} or less lands before you recover`;
  switch (cls) {
    case "plus":
      return "you act first";
    case "even":
      return "both sides act at once";
    case "safe":
      return `the opponent's fastest attack (${rules.fastest}f) does not reach you in time`;
    case "punishable":
      return `their fastest attack (${rules.fastest}f) lands${lands}`;
    case "launch-punishable":
      return `a launching punish lands${lands}`;
    case "state":
      return "no block class, what follows depends on the state";
  }
}

/** Why an ending has its class, in one sentence: "Punishable (-10 or less, above -15): …". */
export function explainBlockClass(cls: BlockClass, onBlock: Outcome, rules: BlockRules): string {
  const word = BLOCK_CLASS_WORD[cls];
  return `${word[0]!.toUpperCase()}${word.slice(1)} (${blockClassRange(cls, rules)}): ${blockClassMeaning(cls, rules, onBlock)}.`;
}

/** The hover of an on-block figure: the figure, then why it has its class under these rules. */
export function explainOnBlock(onBlock: Outcome, rules: BlockRules): string {
  return `${formatOutcome(onBlock)} on block. ${explainBlockClass(classifyBlock(onBlock, rules), onBlock, rules)}`;
}

/** "saves 10f" or "costs 3f": a cancel's frames saved as a label. */
export function framesSavedLabel(saved: number): string {
  return saved >= 0 ? `saves ${saved}f` : `costs ${-saved}f`;
}

/** How a cancel's frames saved come about, in one sentence, from the two endings it compares. */
export function explainFramesSaved(cancelOnBlock: Outcome, moveOnBlock: Outcome): string {
  const both = `${formatOutcome(cancelOnBlock)} on block instead of ${formatOutcome(moveOnBlock)} when stopping at the hit`;
  const saved = framesSaved(cancelOnBlock, moveOnBlock);
  if (saved === null) return `Cancelled: ${both}; no frames saved can be counted, as one of them is a state.`;
  const sum = `${formatOutcome(cancelOnBlock)} − (${formatOutcome(moveOnBlock)}) = ${saved}`;
  return `Cancelled: ${both}: ${sum} frames ${saved >= 0 ? "saved" : "lost"}.`;
}

/** How `gapAtAdvantage` gets its figure, written out: "12 − (-4) − 1 = 15". */
export function gapAtAdvantageSum(advantage: number, startup: number): string {
  return `${startup} − (${formatFrames(advantage)}) − 1 = ${gapAtAdvantage(advantage, startup)}`;
}

/** What a gap on block means for the defender: "3 frames, so a defender move of startup 3 or less hits first". */
export function explainGap(gap: number): string {
  return gapJails(gap)
    ? `${gap} frames, 0 or less, so the string jails here: a blocking defender cannot act before the next hit`
    : `${gap} frames, so a defender move of startup ${gap} or less hits first`;
}

/** The follow-up classes in words. */
export const FOLLOW_UP_WORD: Readonly<Record<FollowUpClass, string>> = Object.freeze({
  guaranteed: "guaranteed",
  "frame-trap": "frame trap",
  interruptible: "interruptible",
});

/** Why a follow-up of startup `s` at advantage `a` has its class, in one sentence. */
export function explainFollowUp(
  advantage: number,
  startup: number,
  { fastest = DEFAULT_FASTEST }: { fastest?: number } = {},
): string {
  const a = formatFrames(advantage);
  switch (followUp(advantage, startup, { fastest })) {
    case "guaranteed":
      return `Startup ${startup} ≤ advantage ${a}: it lands before the opponent can act.`;
    case "frame-trap":
      return `Startup ${startup} is above ${a} but below ${a} + ${fastest}: no ${fastest}-frame button of theirs hits first or trades.`;
    case "interruptible":
      return `Startup ${startup} is ${a} + ${fastest} or more: a defender move of startup ${gapAtAdvantage(advantage, startup)} or less hits first.`;
  }
}

/** Why a defender move punishes an ending: "Startup 12 ≤ 14: it lands before you recover." */
export function explainPunisher(startup: number, onBlock: Outcome): string {
  const limit = punishWindow(onBlock);
  return limit !== null && startup <= limit
    ? `Startup ${startup} ≤ ${limit}: it lands before you recover.`
    : `Startup ${startup}: too slow to punish ${formatOutcome(onBlock)} on block.`;
}

/**
 * Whether a stance cancel turns a punishable ending safe: stopping at the hit is punishable or
 * launch-punishable, and the cancel's ending is safe, even or plus. False when either is a state.
 */
export function turnsPunishableSafe(
  rawOnBlock: Outcome,
  cancelledOnBlock: Outcome,
  rules: { fastest?: number; launchAt?: number } = {},
): boolean {
  const before = BLOCK_CLASS_RANK[classifyBlock(rawOnBlock, rules)];
  const after = BLOCK_CLASS_RANK[classifyBlock(cancelledOnBlock, rules)];
  return before !== undefined && after !== undefined && before >= 3 && after <= 2;
}

/**
 * The hover of a stance move's combo mark after a cancel: startup `s` against the cancel's
 * on-hit (or on-counter-hit) advantage `a`, combo when `s <= a`.
 */
export function explainComboAfterCancel(
  onHit: Outcome,
  startup: number | null,
  { counterHit = false }: { counterHit?: boolean } = {},
): string {
  const when = counterHit ? "If the cancelled hit lands as a counter hit" : "If the cancelled hit lands";
  if (startup === null) return `${when}: this move has no startup, so whether it combos is not known.`;
  const a = outcomeFrames(onHit);
  if (a !== a) return `${when} the defender is left in ${formatOutcome(onHit)}: no frame count to combo from.`;
  return combosAtAdvantage(a, startup)
    ? `${when}: startup ${startup} ≤ ${formatFrames(a)}, so it combos.`
    : `${when}: startup ${startup} is above ${formatFrames(a)}, so the defender can block it.`;
}

/**
 * The hover of a stance move's gap and follow-up class right after a cancel: the sum that gives
 * the gap, and why the move has its class. Null when the cancel's ending is a state or the move
 * has no startup.
 */
export function explainAfterCancel(
  cancelOnBlock: Outcome,
  startup: number | null,
  { fastest = DEFAULT_FASTEST }: { fastest?: number } = {},
): { gap: string; followUp: string } | null {
  const a = outcomeFrames(cancelOnBlock);
  if (startup === null || a !== a) return null;
  const gap = gapAtAdvantage(a, startup);
  return {
    gap: `Gap on block after the cancel: ${gapAtAdvantageSum(a, startup)}: ${explainGap(gap)}.`,
    followUp: explainFollowUp(a, startup, { fastest }),
  };
}

/** The hover of a way in's auto-guard: the levels the stance entry guards by itself. */
export function explainAutoGuard(levels: readonly Level[]): string {
  return levels.length === 0
    ? "Entering the stance guards nothing by itself."
    : `While entering the stance it guards ${levels.join(", ")} hits by itself.`;
}

// ---------------------------------------------------------------------------------------
// Orders and ranges the move list sorts and filters by.

/**
 * Best ending for the attacker first (plus, even, safe, punishable, launch-punishable), then
 * `state`, which has no place on that scale: a knockdown is not "safer" than -5.
 */
export function compareBlockClass(a: BlockClass, b: BlockClass): number {
  return (BLOCK_CLASS_RANK[a] ?? 5) - (BLOCK_CLASS_RANK[b] ?? 5);
}

/** Fastest first; a move with no startup (a follow-up, or unknown) after every number. */
export function compareStartup(a: number | null, b: number | null): number {
  if (a === null || b === null) return a === b ? 0 : a === null ? 1 : -1;
  return a - b;
}

/** Whether a startup lies in `[min, max]`, either end open when null; no startup is in no closed range. */
export function startupWithin(startup: number | null, min: number | null, max: number | null): boolean {
  if (min === null && max === null) return true;
  if (startup === null) return false;
  return (min === null || startup >= min) && (max === null || startup <= max);
}
