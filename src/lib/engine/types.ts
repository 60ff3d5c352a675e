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
