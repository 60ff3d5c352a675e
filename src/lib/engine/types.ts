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
