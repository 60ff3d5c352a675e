import { EngineInputError } from "./compile";
import { afterCancel, classifyBlock, followUp, framesSaved, outcomeFrames } from "./frames";
import { resolveOptions } from "./walk";
import type {
  BlockClass,
  CancelEdge,
  ExploreOptions,
  FollowUpClass,
  Level,
  MoveGraph,
  MoveNode,
  Outcome,
} from "./types";

/** One way into a stance: a cancel, the ending it replaces and the one it gives. */
export interface StanceWayIn {
  /** The cancel edge's id. */
  cancel: string;
  /** The cancelled move's id. */
  from: string;
  /** The cancelled move's input and the cancel's, e.g. "n.v~ebb". */
  input: string;
  raw: { onBlock: Outcome; blockClass: BlockClass };
  cancelled: { onBlock: Outcome; blockClass: BlockClass; onHit: Outcome; onCounterHit: Outcome };
  framesSaved: number | null;
  autoGuard: Level[];
}

/** One move done from the stance. */
export interface StanceMove {
  /** The enter edge's id. */
  enter: string;
  /** The move's id. */
  move: string;
  input: string;
  level: Level;
  startup: number | null;
  damage: number;
  onBlock: Outcome;
}

/** A way in against a stance move: what the move gives right after that cancel. */
export interface StanceGridCell {
  cancel: string;
  enter: string;
  gapOnBlock: number | null;
  comboOnHit: boolean;
  comboOnCounterHit: boolean;
  followUp: FollowUpClass | null;
}

/** DESIGN.md, "Stance sheet". */
export interface StanceSheet {
  /** Numeric cancelled onBlock, highest first; states last; ties by input. */
  waysIn: StanceWayIn[];
  /** By input, code unit order. */
  moves: StanceMove[];
  /** Ways in order, then moves order. */
  grid: StanceGridCell[];
}

const byCodeUnit = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);

/** The highest numeric advantage first; a state after every number, and no order among states. */
function bestEndingFirst(a: Outcome, b: Outcome): number {
  const x = outcomeFrames(a);
  const y = outcomeFrames(b);
  if (x === x && y === y) return y - x;
  return (x === x ? 0 : 1) - (y === y ? 0 : 1);
}

/**
 * Everything a stance's page shows, from the graph alone: every cancel into the stance (the
 * raw ending beside the cancelled one), every move done from it, and each pair's follow-up
 * at the cancel's advantage. The rules are frames.ts's; this only gathers.
 */
export function stanceSheet(graph: MoveGraph, stanceId: string, options?: ExploreOptions): StanceSheet {
  const stance = graph.nodes.find((n) => n.id === stanceId);
  if (stance?.kind !== "stance") throw new EngineInputError([`unknown stance "${stanceId}"`]);
  const { fastest, launchAt } = resolveOptions(options);
  const rules = { fastest, launchAt };
  const moves = new Map(graph.nodes.filter((n): n is MoveNode => n.kind === "move").map((n) => [n.id, n]));
  const moveOf = (id: string, edge: string) => {
    const m = moves.get(id);
    if (!m) throw new EngineInputError([`edge "${edge}" refers to "${id}", which is not a move`]);
    return m;
  };

  const cancels = graph.edges.filter((e): e is CancelEdge => e.kind === "cancel" && e.to === stanceId);
  const waysIn: StanceWayIn[] = cancels
    .map((c) => {
      const from = moveOf(c.from, c.id);
      return {
        cancel: c.id,
        from: from.id,
        input: `${from.input}${c.input}`,
        raw: { onBlock: from.onBlock, blockClass: classifyBlock(from.onBlock, rules) },
        cancelled: {
          onBlock: c.onBlock,
          blockClass: classifyBlock(c.onBlock, rules),
          onHit: c.onHit,
          onCounterHit: c.onCounterHit,
        },
        framesSaved: framesSaved(c.onBlock, from.onBlock),
        autoGuard: [...c.autoGuard],
      };
    })
    .sort((a, b) => bestEndingFirst(a.cancelled.onBlock, b.cancelled.onBlock) || byCodeUnit(a.input, b.input));

  const stanceMoves: StanceMove[] = graph.edges
    .filter((e) => e.kind === "enter" && e.from === stanceId)
    .map((e) => {
      const m = moveOf(e.to, e.id);
      return {
        enter: e.id,
        move: m.id,
        input: m.input,
        level: m.level,
        startup: m.startup ?? null,
        damage: m.damage,
        onBlock: m.onBlock,
      };
    })
    .sort((a, b) => byCodeUnit(a.input, b.input));

  const byId = new Map(cancels.map((c) => [c.id, c]));
  const grid: StanceGridCell[] = waysIn.flatMap((w) => {
    const c = byId.get(w.cancel)!;
    return stanceMoves.map((m) => {
      const after = afterCancel(c, m.startup);
      const advantage = outcomeFrames(c.onBlock);
      const known = m.startup !== null && advantage === advantage;
      return {
        cancel: w.cancel,
        enter: m.enter,
        ...after,
        followUp: known ? followUp(advantage, m.startup!, { fastest }) : null,
      };
    });
  });

  return { waysIn, moves: stanceMoves, grid };
}
