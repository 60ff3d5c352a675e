import type {
  CancelEdge,
  EnterEdge,
  FollowEdge,
  Level,
  MoveGraph,
  MoveNode,
  Outcome,
  StanceNode,
} from "../../../src/lib/engine";

// Small invented graphs; ids and notation are made up for the tests.

export function move(id: string, input: string, level: Level, over: Partial<MoveNode> = {}): MoveNode {
  return { id, kind: "move", input, level, damage: 10, onBlock: -2, onHit: 4, onCounterHit: 6, ...over };
}

export function stance(id: string, name = `stance ${id}`): StanceNode {
  return { id, kind: "stance", name };
}

export function follow(
  id: string,
  from: string,
  to: string,
  input: string,
  over: Partial<FollowEdge> = {},
): FollowEdge {
  return { id, kind: "follow", from, to, input, gapOnBlock: 0, comboOnHit: true, comboOnCounterHit: true, ...over };
}

export function cancel(
  id: string,
  from: string,
  to: string,
  input: string,
  outcome: { onBlock: Outcome; onHit: Outcome; onCounterHit?: Outcome },
  autoGuard: Level[] = [],
): CancelEdge {
  return { id, kind: "cancel", from, to, input, onCounterHit: outcome.onHit, ...outcome, autoGuard };
}

export function enter(id: string, from: string, to: string, input: string): EnterEdge {
  return { id, kind: "enter", from, to, input };
}

/**
 * a (high) ,2→ b (mid, -14) then either ,4→ c (low) or ,3→ d (high), or ~b into stance s,
 * from which 2→ e (mid, startup 14).
 */
export function sampleGraph(): MoveGraph {
  return {
    nodes: [
      move("a", "1", "high", { damage: 10, startup: 10, onBlock: 1, onHit: 8, onCounterHit: 8 }),
      move("b", "1,2", "mid", { damage: 12, onBlock: -14, onHit: 3, onCounterHit: { state: "knockdown" } }),
      move("c", "1,2,4", "low", { damage: 15, onBlock: -12, onHit: 2, onCounterHit: 2 }),
      move("d", "1,2,3", "high", { damage: 14, onBlock: -3, onHit: 5, onCounterHit: { state: "launch", frames: 40 } }),
      stance("s", "Coil"),
      move("e", "S 2", "mid", { damage: 20, startup: 14, onBlock: -6, onHit: 5, onCounterHit: 9 }),
    ],
    edges: [
      follow("f1", "a", "b", ",2", { gapOnBlock: 0, comboOnHit: true }),
      follow("f2", "b", "c", ",4", { gapOnBlock: 4, comboOnHit: false }),
      follow("f3", "b", "d", ",3", { gapOnBlock: 2, comboOnHit: true }),
      cancel("c1", "b", "s", "~b", { onBlock: -1, onHit: 4, onCounterHit: 6 }, ["high"]),
      enter("n1", "s", "e", "2"),
    ],
  };
}
