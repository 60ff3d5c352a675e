/**
 * Range: how far a move reaches. A game measures it either as free labels ("close",
 * "sweep distance") or as numbers in a unit of its own ("1.8" m); with numbers, a move
 * reaches an opponent at distance d when its range is at least d. A move without a
 * range, or with a label, is never said to reach: Framefork does not guess.
 */

/** How a game measures range: `label` (free text) or `number` (in the game's unit). */
export const RANGE_KINDS = ["label", "number"] as const;
export type RangeKind = (typeof RANGE_KINDS)[number];

/** A game's way of measuring range: its kind, and the unit of a numeric one ("m"). */
export interface RangeScale {
  kind: RangeKind;
  unit: string | null;
}

/** A range as the data holds it: text from a file or the database, or a number from a graph. */
type Range = string | number | null | undefined;

/** A number, at most two decimals, no sign, no exponent: what a numeric game's `range` holds. */
const NUMBER = /^\d{1,3}(\.\d{1,2})?$/;

/** The number a numeric range holds, or null when it is missing or not a number. */
export function parseRange(range: Range): number | null {
  if (range == null) return null;
  if (typeof range === "number") return Number.isFinite(range) && range >= 0 ? range : null;
  const text = range.trim();
  return NUMBER.test(text) ? Number(text) : null;
}

/** Why a range cannot stand in a game of this scale, or null when it can. */
export function rangeProblem(range: Range, scale: RangeScale): string | null {
  if (scale.kind === "label" || range == null || range === "") return null;
  return parseRange(range) === null
    ? `range "${range}" is not a number of ${scale.unit ?? "units"} (this game measures range in numbers, like 1.5)`
    : null;
}

/** Whether a move with this range reaches an opponent standing `distance` away. */
export function reachesAt(range: Range, distance: number): boolean {
  const reach = parseRange(range);
  return reach !== null && reach >= distance;
}

/** A range as it reads beside a move: "1.8 m" for a number, the label itself otherwise; null when none. */
export function formatRange(range: Range, scale: RangeScale): string | null {
  if (range == null || range === "") return null;
  const reach = scale.kind === "number" ? parseRange(range) : null;
  return reach === null ? String(range) : `${reach} ${scale.unit ?? ""}`.trim();
}

/** One sentence on what a hit's range means, for a figure's explanation. */
export function explainRange(range: Range, scale: RangeScale): string {
  const text = formatRange(range, scale);
  if (text === null) return "The data gives no range for this hit.";
  if (scale.kind === "label" || parseRange(range) === null) return `The data describes this hit's range as "${text}".`;
  return `This hit reaches an opponent up to ${text} away; farther than that it whiffs.`;
}
