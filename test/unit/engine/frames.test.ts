import { describe, expect, test } from "vitest";
import {
  classifyBlock,
  compareBlockClass,
  compareStartup,
  startupWithin,
  explorePaths,
  followUp,
  framesSaved,
  gapAtAdvantage,
  combosAtAdvantage,
  afterCancel,
  punishersFor,
  type MoveGraph,
  type PunisherMove,
} from "../../../src/lib/engine";
import { cancel, follow, move, stance } from "./fixtures";

describe("classifyBlock", () => {
  test("the class boundaries with the default fastest 10 and launchAt 15", () => {
    const cases: [number, string][] = [
      [5, "plus"],
      [1, "plus"],
      [0, "even"],
      [-1, "safe"],
      [-9, "safe"],
      [-10, "punishable"],
      [-14, "punishable"],
      [-15, "launch-punishable"],
      [-30, "launch-punishable"],
    ];
    expect(cases.map(([a]) => classifyBlock(a))).toEqual(cases.map(([, c]) => c));
    expect(classifyBlock({ state: "knockdown" })).toBe("state");
    expect(classifyBlock({ state: "throw", frames: -20 })).toBe("state");
  });

  test("a slower opponent moves both thresholds", () => {
    expect(classifyBlock(-11, { fastest: 12, launchAt: 18 })).toBe("safe");
    expect(classifyBlock(-12, { fastest: 12, launchAt: 18 })).toBe("punishable");
    expect(classifyBlock(-17, { fastest: 12, launchAt: 18 })).toBe("punishable");
    expect(classifyBlock(-18, { fastest: 12, launchAt: 18 })).toBe("launch-punishable");
  });
});

describe("followUp", () => {
  test("guaranteed, frame trap, interruptible", () => {
    expect(followUp(8, 8)).toBe("guaranteed");
    expect(followUp(8, 9)).toBe("frame-trap");
    expect(followUp(8, 17)).toBe("frame-trap");
    expect(followUp(8, 18)).toBe("interruptible");
    expect(followUp(-2, 7)).toBe("frame-trap");
    expect(followUp(-2, 8)).toBe("interruptible");
    expect(followUp(3, 14, { fastest: 12 })).toBe("frame-trap");
    expect(followUp(3, 15, { fastest: 12 })).toBe("interruptible");
  });

  test("common practice, no source: at +11 on counter hit a 12-frame follow-up is a frame trap, not guaranteed", () => {
    expect(followUp(11, 12)).toBe("frame-trap");
    // Why it is a trap: the defender has 12 - 11 - 1 = 0 free frames, so even a 10-frame button loses.
    expect(12 - 11 - 1).toBeLessThan(10);
    expect(followUp(11, 12)).not.toBe("guaranteed");
  });
});

const defenderMoves: (PunisherMove & { name: string })[] = [
  { id: "p10", name: "quick jab", startup: 10, damage: 12, from: "standing" },
  { id: "p12", name: "long elbow", startup: 12, damage: 20, from: "standing" },
  { id: "p11", name: "rising knee", startup: 11, damage: 25, from: "crouching" },
  { id: "p15", name: "launcher", startup: 15, damage: 30, from: "standing" },
  { id: "any12", name: "sweep", startup: 12, damage: 20, from: "any" },
];

describe("punishersFor", () => {
  test("common practice, no source: -10 on block is punished by a 10-frame attack, -9 is not", () => {
    expect(punishersFor(-10, "standing", defenderMoves).map((m) => m.id)).toEqual(["p10"]);
    expect(punishersFor(-9, "standing", defenderMoves)).toEqual([]);
  });

  test("best damage first, the faster move first on equal damage", () => {
    const moves: PunisherMove[] = [
      { id: "slow", startup: 14, damage: 20, from: "any" },
      { id: "fast", startup: 11, damage: 20, from: "any" },
      { id: "big", startup: 13, damage: 26, from: "standing" },
    ];
    expect(punishersFor(-14, "standing", moves).map((m) => m.id)).toEqual(["big", "fast", "slow"]);
  });

  test("only moves done from the defender's stance apply", () => {
    expect(punishersFor(-12, "standing", defenderMoves).map((m) => m.id)).toEqual(["p12", "any12", "p10"]);
    expect(punishersFor(-12, "crouching", defenderMoves).map((m) => m.id)).toEqual(["p11", "any12"]);
  });

  test("nothing punishes plus frames, even, or a state", () => {
    expect(punishersFor(0, "standing", defenderMoves)).toEqual([]);
    expect(punishersFor(3, "standing", defenderMoves)).toEqual([]);
    expect(punishersFor({ state: "knockdown" }, "standing", defenderMoves)).toEqual([]);
  });
});

describe("facts of the trade through the engine", () => {
  test("common practice, no source: a -14 move cancelled to -1 saves 13 frames and turns safe", () => {
    const g: MoveGraph = {
      nodes: [move("m", "2", "mid", { onBlock: -14 }), stance("s")],
      edges: [cancel("c", "m", "s", "~b", { onBlock: -1, onHit: 3 })],
    };
    const [plain, cancelled] = explorePaths(g, "m");
    expect(plain?.blockClass).toBe("punishable");
    expect(cancelled?.framesSaved).toBe(13);
    expect(cancelled?.blockClass).toBe("safe");
    expect(punishersFor(plain!.onBlock, plain!.defenderStance, defenderMoves).length).toBeGreaterThan(0);
    expect(punishersFor(cancelled!.onBlock, cancelled!.defenderStance, defenderMoves)).toEqual([]);
  });

  test("common practice, no source: a high can be ducked where the string leaves a gap", () => {
    const g: MoveGraph = {
      nodes: [move("m", "1", "mid"), move("h", "1,1", "high"), move("j", "1,2", "high")],
      edges: [follow("gap", "m", "h", ",1", { gapOnBlock: 3 }), follow("tight", "m", "j", ",2", { gapOnBlock: 0 })],
    };
    const paths = explorePaths(g, "m");
    expect(paths.find((p) => p.edges[0] === "gap")?.duckable).toEqual([1]);
    expect(paths.find((p) => p.edges[0] === "tight")?.duckable).toEqual([]);
  });

  test("common practice, no source: a string ending in a low leaves the defender crouching, so crouching punishers apply", () => {
    const g: MoveGraph = {
      nodes: [move("m", "1", "mid"), move("l", "1,3", "low", { onBlock: -13 })],
      edges: [follow("f", "m", "l", ",3", { gapOnBlock: 0 })],
    };
    const p = explorePaths(g, "m")[1]!;
    expect(p.defenderStance).toBe("crouching");
    const ids = punishersFor(p.onBlock, p.defenderStance, defenderMoves).map((m) => m.id);
    expect(ids).toEqual(["p11", "any12"]);
    expect(ids).not.toContain("p12");
  });
});

describe("cancel rules", () => {
  test("framesSaved is the cancel's advantage minus the hit's, null with a state on either side", () => {
    expect(framesSaved(-1, -14)).toBe(13);
    expect(framesSaved(-6, -2)).toBe(-4);
    expect(framesSaved({ state: "knockdown" }, -14)).toBeNull();
    expect(framesSaved(-1, { state: "crumple", frames: 3 })).toBeNull();
  });

  test("common practice, no source: a cancel from -14 to -1 saves 13 frames and turns punishable into safe", () => {
    expect(framesSaved(-1, -14)).toBe(13);
    expect(classifyBlock(-14)).toBe("punishable");
    expect(classifyBlock(-1)).toBe("safe");
  });

  test("a stance move after a cancel is a follow-up at the cancel's advantage", () => {
    // At -2 on block, a 12-frame stance move leaves 12 - (-2) - 1 = 13 free frames.
    expect(afterCancel({ onBlock: -2, onHit: 8, onCounterHit: 14 }, 12)).toEqual({
      gapOnBlock: 13,
      comboOnHit: false,
      comboOnCounterHit: true,
    });
    // At +5, a 6-frame move jails (gap 0) and combos from +6 on hit.
    expect(afterCancel({ onBlock: 5, onHit: 6, onCounterHit: 6 }, 6)).toEqual({
      gapOnBlock: 0,
      comboOnHit: true,
      comboOnCounterHit: true,
    });
    expect(afterCancel({ onBlock: { state: "knockdown" }, onHit: { state: "launch" }, onCounterHit: 20 }, 12)).toEqual({
      gapOnBlock: null,
      comboOnHit: false,
      comboOnCounterHit: true,
    });
    expect(afterCancel({ onBlock: -2, onHit: 8, onCounterHit: 14 }, null)).toEqual({
      gapOnBlock: null,
      comboOnHit: false,
      comboOnCounterHit: false,
    });
  });

  test("interruptible is exactly where the fastest button (10f) hits first (startup <= gap) or trades (startup = gap + 1)", () => {
    for (let a = -20; a <= 20; a++) {
      for (let s = 1; s <= 30; s++) {
        const gap = gapAtAdvantage(a, s);
        expect(followUp(a, s) === "interruptible").toBe(10 <= gap + 1);
        expect(combosAtAdvantage(a, s)).toBe(followUp(a, s) === "guaranteed");
      }
    }
  });
});

describe("the move list's orders and ranges", () => {
  test("compareBlockClass puts the best ending first and a state last", () => {
    const shuffled = ["state", "punishable", "plus", "launch-punishable", "safe", "even"] as const;
    expect([...shuffled].sort(compareBlockClass).join(" ")).toBe("plus even safe punishable launch-punishable state");
  });

  test("compareStartup: fastest first, no startup last", () => {
    expect([14, null, 10, 12].sort(compareStartup)).toEqual([10, 12, 14, null]);
  });

  test("startupWithin: both ends included, either end open, no startup outside any closed range", () => {
    expect([9, 10, 12, 13].map((s) => startupWithin(s, 10, 12))).toEqual([false, true, true, false]);
    expect(startupWithin(30, 13, null)).toBe(true);
    expect(startupWithin(5, null, 4)).toBe(false);
    expect(startupWithin(null, null, null)).toBe(true);
    expect(startupWithin(null, 10, null)).toBe(false);
  });
});
