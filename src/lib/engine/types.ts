import type { z } from "zod";
import type {
  cancelEdgeSchema,
  edgeSchema,
  enterEdgeSchema,
  followEdgeSchema,
  graphSchema,
  moveNodeSchema,
  nodeSchema,
  optionsSchema,
  outcomeSchema,
  stanceNodeSchema,
} from "./schema";

export type Level = "high" | "mid" | "low" | "special-mid" | "throw" | "unblockable";
export type StateName = "knockdown" | "launch" | "wall-splat" | "crumple" | "throw";
export type Outcome = z.infer<typeof outcomeSchema>;
export type StateOutcome = Exclude<Outcome, number>;

export type MoveNode = z.infer<typeof moveNodeSchema>;
export type StanceNode = z.infer<typeof stanceNodeSchema>;
export type GraphNode = z.infer<typeof nodeSchema>;
export type FollowEdge = z.infer<typeof followEdgeSchema>;
export type CancelEdge = z.infer<typeof cancelEdgeSchema>;
export type EnterEdge = z.infer<typeof enterEdgeSchema>;
export type GraphEdge = z.infer<typeof edgeSchema>;
export type MoveGraph = z.infer<typeof graphSchema>;

/** What a caller may pass: every field optional, defaults filled in by the schema. */
export type ExploreOptions = z.input<typeof optionsSchema>;
export type ResolvedOptions = z.output<typeof optionsSchema>;

export type Guard = "stand" | "duck" | "crouch" | "break" | "evade";
export type BlockClass = "plus" | "even" | "safe" | "punishable" | "launch-punishable" | "state";
export type DefenderStance = "standing" | "crouching";
export type FollowUpClass = "guaranteed" | "frame-trap" | "interruptible";

export interface Gap {
  /** 0-based index of the hit before the gap. */
  after: number;
  frames: number;
}

/**
 * One path and its annotations, as JSON. Lists are read-only: a materialised result shares
 * its unchanging parts (the guards of each level, empty lists, state outcomes) as frozen
 * values instead of copying them into every path.
 */
export interface PathResult {
  nodes: readonly string[];
  edges: readonly string[];
  input: string;
  levels: readonly Level[];
  damage: number;
  endsIn: "move" | "stance";
  onBlock: Outcome;
  onHit: Outcome;
  onCounterHit: Outcome;
  framesSaved: number | null;
  blockClass: BlockClass;
  defenderStance: DefenderStance;
  guards: readonly (readonly Guard[])[];
  naturalCombo: boolean;
  jails: boolean;
  gaps: readonly Readonly<Gap>[];
  duckable: readonly number[];
  mixupPoints: readonly string[];
  autoGuard: readonly Level[];
}

/** Anything a ranking or filter may read: a materialised result or the streaming cursor. */
export type PathView = Readonly<PathResult>;

/** One field whose value differs between two versions: `null` on a side that lacks the field. */
export interface FieldChange {
  field: string;
  before: unknown;
  after: unknown;
}

/** A node or an edge in both graphs whose fields differ, the fields sorted by name. */
export interface ChangedItem {
  id: string;
  changes: FieldChange[];
}

/** What changed among one kind of item (nodes or edges), ids in code unit order. */
export interface ItemsDiff {
  added: string[];
  removed: string[];
  changed: ChangedItem[];
}

/** A path that exists on one side only, or whose compared fields differ. */
export interface PathChange {
  /** The root move's id. */
  root: string;
  /** Edge ids along the path: with the root, its identity in both graphs. */
  edges: string[];
  /** The path's input: the `after` side's where the path exists there. */
  input: string;
  status: "added" | "removed" | "changed";
  /** Only blockClass, onHit, naturalCombo, jails, in that order; empty unless "changed". */
  changes: FieldChange[];
}

/** What changed between two graphs of one character (DESIGN.md, "Editions over time"). */
export interface GraphDiff {
  nodes: ItemsDiff;
  edges: ItemsDiff;
  paths: PathChange[];
}

// ---------------------------------------------------------------------------------------
// Mix-up boards (DESIGN.md, "Board contract")

/** One situation of a board: attacker options (rows) against defender options (columns). */
export interface BoardSituation {
  id: string;
  name: string;
  /** Attacker options, 1 to 12. */
  rows: string[];
  /** Defender options, 1 to 12. */
  cols: string[];
  /** rows x cols, the attacker's payoff, finite. */
  payoffs: number[][];
  /** Optional, rows x cols: the situation a cell leads to. */
  next?: (string | null)[][];
}

export interface Board {
  root: string;
  situations: BoardSituation[];
}

export interface SituationSolution {
  /** The value of the situation for the attacker. */
  value: number;
  /** The attacker's optimal mix (sums to 1). */
  row: number[];
  /** The defender's optimal mix (sums to 1). */
  col: number[];
  /** Effective payoff: the payoff plus the value of the cell's next situation. */
  cells: number[][];
  /** value - (row i against the defender's mix): >= 0, and 0 where row i is played. */
  rowShortfall: number[];
  /** (column j against the attacker's mix) - value: >= 0. */
  colShortfall: number[];
}

export interface BoardSolution {
  value: number;
  situations: Record<string, SituationSolution>;
}

/**
 * What a board's numbers are worth, in damage points to the attacker. A board's cells
 * filled from the engine keep their basis (below) and are valued through this table, so a
 * coach who changes the table sees every filled cell follow.
 */
export interface ValueTable {
  /** What each frame the attacker is ahead is worth to them. */
  plusFrame: number;
  /** What each frame the attacker is behind costs them, when no punisher is known. */
  minusFrame: number;
  /** What leaving the defender in each state is worth to the attacker, beyond the hit's damage. */
  states: Record<StateName, number>;
  /** What a hit that whiffs (a high ducked) costs the attacker: the defender's free answer. */
  whiff: number;
}

/** A move a cell names: the opponent's punisher or interrupt. */
export interface BoardMove {
  input: string;
  damage: number;
  startup: number;
}

/**
 * Where a filled cell's number comes from: the engine's facts about that exchange, which
 * the value table turns into a payoff.
 * - `blocked`: the guard stops the hit; the block outcome, valued by the punisher it allows
 *   (from the defender's stance after the hit) or else by the value of its frames.
 * - `hit`: a wrong guard; the hit's damage plus the value of the outcome it leaves.
 * - `whiff`: the guard ducks a high; the attacker whiffs.
 * - `interrupted`: the defender's attack fits in the gap before the hit; its damage.
 */
export type CellBasis =
  | { kind: "blocked"; input: string; onBlock: Outcome; defenderStance: DefenderStance; punisher: BoardMove | null }
  | { kind: "hit"; input: string; damage: number; outcome: Outcome; counterHit: boolean }
  | { kind: "whiff"; input: string }
  | { kind: "interrupted"; input: string; gap: number; interrupt: BoardMove };

/** A situation filled from the engine at the end of a path: its options and each cell's basis. */
export interface FilledSituation {
  name: string;
  rows: string[];
  cols: string[];
  /** rows x cols. */
  cells: CellBasis[][];
}
