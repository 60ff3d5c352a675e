import { describe, expect, test } from "vitest";
import {
  DEFAULT_VALUE_TABLE,
  cellPayoff,
  explainCell,
  explorePaths,
  fillSituation,
  punishersFor,
  type BoardMove,
  type CellBasis,
  type MoveGraph,
  type MoveNode,
  type Outcome,
  type OpponentMove,
  type PathResult,
  type ValueTable,
} from "../../../src/lib/engine";
import { DEMO_CHARACTERS } from "../../../src/server/db/seed/demo";
import { postureOf, toMoveGraph } from "../../../src/server/db/seed/dsl";
import { cancel, enter, follow, move, sampleGraph, stance } from "./fixtures";

// Invented graphs and an invented opponent; the expected cells follow DESIGN.md ("Path
// semantics", "Mix-up board") read by hand for each graph.

const OPPONENT: OpponentMove[] = [
  { id: "o1", input: "1", startup: 10, damage: 7, from: "standing" },
  { id: "o2", input: "d+1", startup: 10, damage: 5, from: "any" },
  { id: "o3", input: "2", startup: 12, damage: 18, from: "standing" },
  { id: "o4", input: "uf+4", startup: 11, damage: 30, from: "crouching" },
];
const move_ = (m: OpponentMove) => ({ input: m.input, damage: m.damage, startup: m.startup });
const [JAB, , STRAIGHT, RISING] = OPPONENT.map(move_) as [BoardMove, BoardMove, BoardMove, BoardMove];

function pathOf(graph: MoveGraph, root: string, input: string): PathResult {
  const found = explorePaths(graph, root).find((p) => p.input === input);
  if (found === undefined) throw new Error(`no path ${input}`);
  return found;
}

describe("fillSituation on hand-made graphs", () => {
  // sampleGraph: 1 (high) ,2→ 1,2 (mid, -14) then ,4→ low (-12, gap 4) or ,3→ high (-3, gap 2),
  // or ~b (-1) into Coil, whose 2 (mid, startup 14, -6) is entered from it.
  const graph = sampleGraph();

  test("a mid/low guess point: rows, columns and every cell", () => {
    const s = fillSituation(graph, pathOf(graph, "a", "1,2"), { opponent: OPPONENT });
    expect(s.name).toBe("After 1,2 on block");
    expect(s.rows).toEqual(["1,2,4", "1,2,3", "1,2~b", "Stop"]);
    // Gaps 4 and 2 open; the fastest move from standing is 10f (the jab: more damage than d+1).
    expect(s.cols).toEqual(["Stand guard", "Crouch guard", "Press 1 (10f)"]);
    const low: CellBasis[] = [
      { kind: "hit", input: "1,2,4", damage: 15, outcome: 2, counterHit: false },
      // Blocked low: the defender crouches, so the crouching-only 30-damage rising move
      // punishes -12 and the standing-only 2 (18 damage, 12f) does not.
      { kind: "blocked", input: "1,2,4", onBlock: -12, defenderStance: "crouching", punisher: RISING },
      // 10f does not fit the 4-frame gap: the low lands as a counter hit.
      { kind: "hit", input: "1,2,4", damage: 15, outcome: 2, counterHit: true },
    ];
    const high: CellBasis[] = [
      { kind: "blocked", input: "1,2,3", onBlock: -3, defenderStance: "standing", punisher: null },
      { kind: "whiff", input: "1,2,3" },
      { kind: "hit", input: "1,2,3", damage: 14, outcome: { state: "launch", frames: 40 }, counterHit: true },
    ];
    const cancelled: CellBasis = {
      kind: "blocked",
      input: "1,2~b",
      onBlock: -1,
      defenderStance: "standing",
      punisher: null,
    };
    // Stopping at -14 from standing: the best standing punisher is the 2 (18 damage), not the crouching-only 30.
    const stop: CellBasis = {
      kind: "blocked",
      input: "1,2",
      onBlock: -14,
      defenderStance: "standing",
      punisher: STRAIGHT,
    };
    expect(s.cells).toEqual([low, high, [cancelled, cancelled, cancelled], [stop, stop, stop]]);
  });

  test("a path that ends in a stance: its entered moves and Stop, the gap from the cancel's advantage", () => {
    const s = fillSituation(graph, pathOf(graph, "a", "1,2~b"), { opponent: OPPONENT });
    expect(s.name).toBe("In Coil after 1,2~b");
    expect(s.rows).toEqual(["1,2~b2", "Stop"]);
    expect(s.cols).toEqual(["Stand guard", "Crouch guard", "Press 1 (10f)"]);
    const entered = "1,2~b2";
    // The Coil's 2 (startup 14) after the cancel's -1: a gap of 14 - (-1) - 1 = 14, and the 10f jab fits.
    expect(s.cells[0]).toEqual([
      { kind: "blocked", input: entered, onBlock: -6, defenderStance: "standing", punisher: null },
      { kind: "hit", input: entered, damage: 20, outcome: 5, counterHit: false },
      { kind: "interrupted", input: entered, gap: 14, interrupt: JAB },
    ]);
    const stop = { kind: "blocked", input: "1,2~b", onBlock: -1, defenderStance: "standing", punisher: null };
    expect(s.cells[1]).toEqual([stop, stop, stop]);
  });

  test("pressing: interrupted when the startup fits the gap, a counter hit when it does not", () => {
    const g: MoveGraph = {
      nodes: [
        move("a", "1", "mid", { onBlock: -2 }),
        move("wide", "1,1", "mid", { damage: 16, onHit: 3, onCounterHit: { state: "knockdown" } }),
        move("just", "1,2", "mid", { damage: 12, onCounterHit: 9 }),
        move("tight", "1,3", "mid", { damage: 11, onCounterHit: 8 }),
        move("jail", "1,4", "mid", { damage: 9, onCounterHit: 7 }),
      ],
      edges: [
        follow("f1", "a", "wide", ",1", { gapOnBlock: 12 }),
        follow("f2", "a", "just", ",2", { gapOnBlock: 10 }),
        follow("f3", "a", "tight", ",3", { gapOnBlock: 9 }),
        follow("f4", "a", "jail", ",4", { gapOnBlock: 0 }),
      ],
    };
    const s = fillSituation(g, pathOf(g, "a", "1"), { opponent: OPPONENT });
    expect(s.cols[2]).toBe("Press 1 (10f)");
    expect(s.cells.map((row) => row[2])).toEqual([
      { kind: "interrupted", input: "1,1", gap: 12, interrupt: JAB },
      { kind: "interrupted", input: "1,2", gap: 10, interrupt: JAB },
      { kind: "hit", input: "1,3", damage: 11, outcome: 8, counterHit: true },
      { kind: "hit", input: "1,4", damage: 9, outcome: 7, counterHit: true },
      { kind: "blocked", input: "1", onBlock: -2, defenderStance: "standing", punisher: null },
    ]);
  });

  test("no press column when every step jails, or when the opponent has no move from the defender's stance", () => {
    const g: MoveGraph = {
      nodes: [move("a", "1", "low"), move("b", "1,2", "mid"), move("c", "1,3", "low")],
      edges: [follow("f1", "a", "b", ",2", { gapOnBlock: 0 }), follow("f2", "a", "c", ",3", { gapOnBlock: 5 })],
    };
    const jailing = { ...g, edges: [g.edges[0]!] };
    expect(fillSituation(jailing, pathOf(jailing, "a", "1"), { opponent: OPPONENT }).cols).toEqual([
      "Stand guard",
      "Crouch guard",
    ]);
    // After a blocked low the defender crouches: only d+1 and uf+4 can be done from there, d+1 the faster.
    expect(fillSituation(g, pathOf(g, "a", "1"), { opponent: OPPONENT }).cols[2]).toBe("Press d+1 (10f)");
    const standingOnly = OPPONENT.filter((m) => m.from === "standing");
    expect(fillSituation(g, pathOf(g, "a", "1"), { opponent: standingOnly }).cols).toHaveLength(2);
    expect(fillSituation(g, pathOf(g, "a", "1"), { opponent: [] }).cols).toHaveLength(2);
  });

  test("a low then a cancel: the cancel row keeps the crouching defender; throws and unblockables get through both guards", () => {
    const g: MoveGraph = {
      nodes: [
        move("a", "d+4", "low", { onBlock: -13 }),
        move("t", "d+4,1+3", "throw", { damage: 35, onHit: { state: "throw" } }),
        move("u", "d+4,1+2", "unblockable", { damage: 40, onHit: { state: "knockdown" } }),
        move("sp", "d+4,3", "special-mid", { onBlock: -4 }),
        stance("st", "Low Lean"),
      ],
      edges: [
        follow("f1", "a", "t", ",1+3", { gapOnBlock: -1 }),
        follow("f2", "a", "u", ",1+2", { gapOnBlock: -1 }),
        follow("f3", "a", "sp", ",3", { gapOnBlock: -1 }),
        cancel("c1", "a", "st", "~d", { onBlock: -11, onHit: 2 }),
      ],
    };
    const s = fillSituation(g, pathOf(g, "a", "d+4"), { opponent: OPPONENT });
    expect(s.rows).toEqual(["d+4,1+3", "d+4,1+2", "d+4,3", "d+4~d", "Stop"]);
    expect(s.cells[0]).toEqual([
      { kind: "hit", input: "d+4,1+3", damage: 35, outcome: { state: "throw" }, counterHit: false },
      { kind: "hit", input: "d+4,1+3", damage: 35, outcome: { state: "throw" }, counterHit: false },
    ]);
    expect(s.cells[1]!.map((c) => c.kind)).toEqual(["hit", "hit"]);
    // A special mid is stopped by both guards.
    expect(s.cells[2]!.map((c) => c.kind)).toEqual(["blocked", "blocked"]);
    // The cancel's -11 against a crouching defender: uf+4 (11f, crouching only) punishes.
    const cancelled = { kind: "blocked", input: "d+4~d", onBlock: -11, defenderStance: "crouching", punisher: RISING };
    expect(s.cells[3]).toEqual([cancelled, cancelled]);
    expect(s.cells[4]![0]).toEqual({
      kind: "blocked",
      input: "d+4",
      onBlock: -13,
      defenderStance: "crouching",
      punisher: RISING,
    });
  });

  test("a stance reached twice: the walk allows the one more visit the extension needs", () => {
    const g: MoveGraph = {
      nodes: [move("a", "1", "mid"), stance("s", "Loop"), move("m", "S1", "mid", { startup: 12 })],
      edges: [
        cancel("c1", "a", "s", "~f", { onBlock: 1, onHit: 5 }),
        enter("e1", "s", "m", ":1"),
        cancel("c2", "m", "s", "~f", { onBlock: 2, onHit: 6 }),
      ],
    };
    const path = explorePaths(g, "a", { maxStanceVisits: 2 }).find((p) => p.input === "1~f:1~f")!;
    const s = fillSituation(g, path, { opponent: OPPONENT });
    expect(s.name).toBe("In Loop after 1~f:1~f");
    expect(s.rows).toEqual(["1~f:1~f:1", "Stop"]);
    // Startup 12 after +2: a gap of 9, so the 10f jab does not fit.
    expect(s.cells[0]![2]).toEqual({ kind: "hit", input: "1~f:1~f:1", damage: 10, outcome: 6, counterHit: true });
  });

  test("a path from another graph is refused with its input", () => {
    const other = pathOf(graph, "a", "1,2");
    const g: MoveGraph = {
      nodes: [move("a", "1", "mid"), move("b", "1,9", "mid")],
      edges: [follow("x", "a", "b", ",9")],
    };
    expect(() => fillSituation(g, other, { opponent: OPPONENT })).toThrow(/path "1,2" is not a path of this graph/);
  });
});

describe("cellPayoff and explainCell on each kind of cell", () => {
  const values: ValueTable = {
    plusFrame: 2,
    minusFrame: 0.5,
    states: { knockdown: 10, launch: 35, "wall-splat": 25, crumple: 30, throw: 0 },
    whiff: 20,
  };
  const blocked = (onBlock: Outcome, punisher: BoardMove | null = null) =>
    ({ kind: "blocked", input: "1,2,3", onBlock, defenderStance: "standing", punisher }) as const;

  test("blocked and punished: minus the punisher's damage", () => {
    const b = blocked(-12, { input: "2", startup: 12, damage: 28 });
    expect(cellPayoff(b, values)).toBe(-28);
    expect(explainCell(b, values, "Stand guard")).toBe(
      "Stand guard blocks 1,2,3 at -12; the opponent's 2 (12f, 28 damage) punishes it from standing: -28.",
    );
  });

  test("blocked, not punished: the frames' value, ahead or behind; a state's value", () => {
    expect(cellPayoff(blocked(3), values)).toBe(6);
    expect(explainCell(blocked(3), values, "Crouch guard")).toBe(
      "Crouch guard blocks 1,2,3 at +3; the 3 frames ahead are worth 2 each: +6.",
    );
    expect(cellPayoff(blocked(-4), values)).toBe(-2);
    expect(explainCell(blocked(-4), values)).toBe(
      "1,2,3 is blocked at -4; no move of the opponent's punishes it from standing, and the 4 frames behind cost 0.5 each: -2.",
    );
    expect(cellPayoff(blocked(0), values)).toBe(0);
    expect(explainCell(blocked(0), values, "Stand guard")).toBe(
      "Stand guard blocks 1,2,3 at 0; neither side is ahead: 0.",
    );
    expect(cellPayoff(blocked({ state: "knockdown" }), values)).toBe(10);
    expect(explainCell(blocked({ state: "knockdown" }), values, "Stand guard")).toBe(
      "Stand guard blocks 1,2,3, which leaves the defender in knockdown, worth 10: +10.",
    );
  });

  test("a string that stops, in the press column: pressing is guarding", () => {
    const stop = { ...blocked(-14, { input: "2", startup: 12, damage: 18 }), input: "1,2" };
    expect(explainCell(stop, values, "Press 1 (10f)")).toBe(
      "Pressing when the string stops at 1,2 is guarding (Press 1 (10f)): it is blocked at -14; the opponent's 2 (12f, 18 damage) punishes it from standing: -18.",
    );
  });

  test("hit: damage plus the outcome's value; counter hit in the press column", () => {
    const hit: CellBasis = { kind: "hit", input: "1,2,4", damage: 15, outcome: 2, counterHit: false };
    expect(cellPayoff(hit, values)).toBe(19);
    expect(explainCell(hit, values, "Stand guard")).toBe(
      "Stand guard does not stop 1,2,4, which hits for 15 damage and leaves +2; the 2 frames ahead are worth 2 each: +19.",
    );
    const ch: CellBasis = { kind: "hit", input: "1,2,3", damage: 14, outcome: { state: "launch" }, counterHit: true };
    expect(cellPayoff(ch, values)).toBe(49);
    expect(explainCell(ch, values, "Press 1 (10f)")).toBe(
      "Press 1 (10f) does not fit before 1,2,3, which lands as a counter hit for 14 damage and leaves launch, worth 35: +49.",
    );
    const behind: CellBasis = { kind: "hit", input: "1", damage: 5, outcome: -2, counterHit: false };
    expect(cellPayoff(behind, values)).toBe(4);
  });

  test("whiff: minus the whiff's cost", () => {
    const w: CellBasis = { kind: "whiff", input: "1,2,1" };
    expect(cellPayoff(w, values)).toBe(-20);
    expect(explainCell(w, values, "Crouch guard")).toBe(
      "Crouch guard ducks the high 1,2,1 and the attacker whiffs, which costs 20: -20.",
    );
  });

  test("interrupted: minus the interrupting move's damage", () => {
    const i: CellBasis = {
      kind: "interrupted",
      input: "1,1",
      gap: 12,
      interrupt: { input: "1", startup: 10, damage: 7 },
    };
    expect(cellPayoff(i, values)).toBe(-7);
    expect(explainCell(i, values, "Press 1 (10f)")).toBe(
      "The opponent's 1 (10f) hits first in the gap before 1,1 (12 frames, so a defender move of startup 12 or less hits first), for 7 damage: -7.",
    );
  });

  test("without a column, each sentence still says where the number comes from", () => {
    const values = DEFAULT_VALUE_TABLE;
    expect(explainCell(blocked(-12, JAB), values)).toBe(
      "1,2,3 is blocked at -12; the opponent's 1 (10f, 7 damage) punishes it from standing: -7.",
    );
    expect(explainCell({ kind: "hit", input: "1,2", damage: 9, outcome: 5, counterHit: true }, values)).toBe(
      "1,2 lands as a counter hit for 9 damage and leaves +5; the 5 frames ahead are worth 1 each: +14.",
    );
    expect(explainCell({ kind: "whiff", input: "1,2,1" }, values)).toBe(
      "The guard ducks the high 1,2,1 and the attacker whiffs, which costs 20: -20.",
    );
  });

  test("the default table is Framefork's: a frame is worth a point either way", () => {
    expect(cellPayoff(blocked(-3), DEFAULT_VALUE_TABLE)).toBe(-3);
    expect(cellPayoff(blocked(3), DEFAULT_VALUE_TABLE)).toBe(3);
    expect(cellPayoff({ kind: "whiff", input: "1" }, DEFAULT_VALUE_TABLE)).toBe(-DEFAULT_VALUE_TABLE.whiff);
  });
});

describe("fillSituation on the demo game", () => {
  // Tarrow's n.v (Vesper Circuit 1.0, invented data) splits into a high, a mid and a low, and
  // Quessaline's neutral moves answer it.
  const tarrow = toMoveGraph(DEMO_CHARACTERS.find((c) => c.slug === "tarrow")!.data("1-0"));
  const quessaline = toMoveGraph(DEMO_CHARACTERS.find((c) => c.slug === "quessaline")!.data("1-0"));
  const entered = new Set(quessaline.edges.filter((e) => e.kind !== "cancel").map((e) => e.to));
  const opponent: OpponentMove[] = quessaline.nodes.flatMap((n) =>
    n.kind === "move" && !entered.has(n.id) && n.startup !== undefined
      ? [{ id: n.id, input: n.input, startup: n.startup, damage: n.damage, from: postureOf(n.input) }]
      : [],
  );

  test("a mid/low guess point of an explored path: each cell is what the engine says of that path", () => {
    const paths = explorePaths(tarrow, "n");
    const through = paths.find((p) => p.mixupPoints.length > 0)!;
    const point = through.mixupPoints[0]!;
    const at = paths.find((p) => p.nodes[p.nodes.length - 1] === point && p.endsIn === "move")!;
    expect(at.input).toBe("n.v");
    const s = fillSituation(tarrow, at, { opponent });
    expect(s.rows).toEqual(["n.v.n", "n.v.t", "n.v.r", "n.v~ebb", "Stop"]);
    expect(s.cols.slice(0, 2)).toEqual(["Stand guard", "Crouch guard"]);

    for (const [i, label] of s.rows.entries()) {
      const p = label === "Stop" ? at : paths.find((q) => q.input === label)!;
      const level = p.endsIn === "move" && label !== "Stop" ? p.levels[p.levels.length - 1]! : null;
      const asBlocked = {
        kind: "blocked",
        input: p.input,
        onBlock: p.onBlock,
        defenderStance: p.defenderStance,
        punisher: punishersFor(p.onBlock, p.defenderStance, opponent).map(move_)[0] ?? null,
      };
      const [stand, crouch] = s.cells[i]!;
      if (level === null) {
        expect(stand).toEqual(asBlocked);
        expect(crouch).toEqual(asBlocked);
      } else {
        expect(stand).toEqual(level === "low" ? expect.objectContaining({ kind: "hit" }) : asBlocked);
        expect(crouch).toEqual(
          level === "high"
            ? { kind: "whiff", input: p.input }
            : level === "low"
              ? asBlocked
              : expect.objectContaining({
                  kind: "hit",
                  damage: tarrow.nodes.find((n): n is MoveNode => n.id === p.nodes.at(-1) && n.kind === "move")!.damage,
                }),
        );
      }
    }
    // The blocked low leaves the defender crouching: only moves done from a crouch punish it.
    const low = s.cells[2]![1]!;
    expect(low).toMatchObject({ kind: "blocked", defenderStance: "crouching", onBlock: -13 });
    const punisher = (low as { punisher: { input: string } | null }).punisher!;
    expect(opponent.find((m) => m.input === punisher.input)!.from).not.toBe("standing");
    // From standing, Quessaline's throw (12f, 32 damage) would have punished -13: crouching rules it out.
    expect(punishersFor(-13, "standing", opponent)[0]!.input).toBe("c");
    expect(s.cells[0]![1]).toEqual({ kind: "whiff", input: "n.v.n" });
  });
});
