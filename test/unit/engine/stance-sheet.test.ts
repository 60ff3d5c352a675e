import { fc, test } from "@fast-check/vitest";
import { describe, expect } from "vitest";
import { EngineInputError, stanceSheet, type MoveGraph } from "../../../src/lib/engine";
import { cancel, enter, move, sampleGraph, stance } from "./fixtures";
import { graphArb, oraclePaths, optionsArb } from "./random-graphs";

describe("stanceSheet on hand-made stances", () => {
  test("a cancel from -14 to -1 saves 13 frames and turns punishable into safe (common practice, no source)", () => {
    const sheet = stanceSheet(sampleGraph(), "s", { fastest: 10, launchAt: 15 });
    expect(sheet.waysIn).toEqual([
      {
        cancel: "c1",
        from: "b",
        input: "1,2~b",
        raw: { onBlock: -14, blockClass: "punishable" },
        cancelled: { onBlock: -1, blockClass: "safe", onHit: 4, onCounterHit: 6 },
        framesSaved: 13,
        autoGuard: ["high"],
      },
    ]);
    expect(sheet.moves).toEqual([
      { enter: "n1", move: "e", input: "S 2", level: "mid", startup: 14, damage: 20, onBlock: -6 },
    ]);
    // A 14-frame move at -1: 14 - (-1) - 1 = 14 frames of gap, no combo at +4 or +6, and far past a frame trap.
    expect(sheet.grid).toEqual([
      {
        cancel: "c1",
        enter: "n1",
        gapOnBlock: 14,
        comboOnHit: false,
        comboOnCounterHit: false,
        followUp: "interruptible",
      },
    ]);
  });

  /** Stance "k" with four ways in and three moves; the inputs are chosen to test the orders. */
  function crane(): MoveGraph {
    return {
      nodes: [
        move("p", "2", "mid", { startup: 12, onBlock: -9 }),
        move("q", "3", "low", { startup: 15, onBlock: -16 }),
        move("r", "4", "high", { startup: 11, onBlock: { state: "knockdown" } }),
        move("t", "1", "mid", { startup: 13, onBlock: -5 }),
        stance("k", "Crane"),
        move("x", "K b", "mid", { startup: 12, damage: 18, onBlock: -4 }),
        move("y", "K B", "low", { startup: 16, damage: 12, onBlock: -11 }),
        move("z", "K 1", "high", { damage: 30, onBlock: { state: "throw" } }),
      ],
      edges: [
        cancel("k1", "p", "k", "~f", { onBlock: 3, onHit: 12, onCounterHit: 16 }, ["mid"]),
        cancel("k2", "q", "k", "~f", { onBlock: -2, onHit: 6, onCounterHit: 6 }),
        cancel("k3", "r", "k", "~f", { onBlock: { state: "crumple" }, onHit: 8, onCounterHit: 8 }),
        cancel("k4", "t", "k", "~f", { onBlock: 3, onHit: 4, onCounterHit: 4 }),
        enter("e1", "k", "x", "b"),
        enter("e2", "k", "y", "B"),
        enter("e3", "k", "z", "1"),
      ],
    };
  }

  test("ways in: best numeric ending first, ties by input, states last; frames saved only between numbers", () => {
    const sheet = stanceSheet(crane(), "k", { fastest: 10, launchAt: 15 });
    expect(sheet.waysIn.map((w) => [w.input, w.cancelled.onBlock, w.framesSaved])).toEqual([
      ["1~f", 3, 8],
      ["2~f", 3, 12],
      ["3~f", -2, 14],
      ["4~f", { state: "crumple" }, null],
    ]);
    expect(sheet.waysIn.map((w) => [w.raw.blockClass, w.cancelled.blockClass])).toEqual([
      ["safe", "plus"],
      ["safe", "plus"],
      ["launch-punishable", "safe"],
      ["state", "state"],
    ]);
  });

  test("moves by input in code unit order (capitals before small letters), a move without startup kept", () => {
    const sheet = stanceSheet(crane(), "k");
    expect(sheet.moves.map((m) => [m.input, m.startup])).toEqual([
      ["K 1", null],
      ["K B", 16],
      ["K b", 12],
    ]);
  });

  test("the grid: every way in against every move, in both orders, each rule at the cancel's advantage", () => {
    const sheet = stanceSheet(crane(), "k", { fastest: 10, launchAt: 15 });
    const cell = (cancel: string, enter: string) => sheet.grid.find((g) => g.cancel === cancel && g.enter === enter)!;
    expect(sheet.grid.map((g) => `${g.cancel}/${g.enter}`)).toEqual([
      "k4/e3",
      "k4/e2",
      "k4/e1",
      "k1/e3",
      "k1/e2",
      "k1/e1",
      "k2/e3",
      "k2/e2",
      "k2/e1",
      "k3/e3",
      "k3/e2",
      "k3/e1",
    ]);
    // +3 then a 12-frame mid: gap 8, a frame trap (12 < 3 + 10); it combos on hit at +12 and on counter hit at +16.
    expect(cell("k1", "e1")).toEqual({
      cancel: "k1",
      enter: "e1",
      gapOnBlock: 8,
      comboOnHit: true,
      comboOnCounterHit: true,
      followUp: "frame-trap",
    });
    // +3 then a 16-frame low: gap 12, interruptible (16 >= 3 + 10); no combo at +4.
    expect(cell("k4", "e2")).toMatchObject({ gapOnBlock: 12, comboOnHit: false, followUp: "interruptible" });
    // -2 then a 12-frame mid: gap 13; on hit +6 does not combo a 12-frame move.
    expect(cell("k2", "e1")).toMatchObject({ gapOnBlock: 13, comboOnHit: false, followUp: "interruptible" });
    // No startup: nothing known. A state on block: no gap and no class; on hit (+8) it is read as ever.
    expect(cell("k1", "e3")).toMatchObject({ gapOnBlock: null, comboOnHit: false, followUp: null });
    expect(cell("k3", "e1")).toMatchObject({ gapOnBlock: null, comboOnHit: false, followUp: null });
    const g = crane();
    g.edges = g.edges.map((e) => (e.id === "k3" ? { ...e, onHit: 12 } : e));
    expect(stanceSheet(g, "k").grid.find((c) => c.cancel === "k3" && c.enter === "e1")).toMatchObject({
      gapOnBlock: null,
      comboOnHit: true,
      followUp: null,
    });
  });

  test("a guaranteed follow-up: startup at or below the cancel's advantage", () => {
    const g = crane();
    g.edges = g.edges.map((e) => (e.id === "k1" ? { ...e, onBlock: 12 } : e));
    expect(stanceSheet(g, "k").grid.find((c) => c.cancel === "k1" && c.enter === "e1")).toMatchObject({
      gapOnBlock: -1,
      followUp: "guaranteed",
    });
  });

  test("an unknown stance, or a move's id, is refused with the id", () => {
    expect(() => stanceSheet(sampleGraph(), "nowhere")).toThrow(EngineInputError);
    expect(() => stanceSheet(sampleGraph(), "nowhere")).toThrow(/nowhere/);
    expect(() => stanceSheet(sampleGraph(), "a")).toThrow(/"a"/);
  });

  test("a stance nobody cancels into and with no moves has an empty sheet", () => {
    const g = sampleGraph();
    g.nodes.push(stance("lonely"));
    expect(stanceSheet(g, "lonely")).toEqual({ waysIn: [], moves: [], grid: [] });
  });
});

describe("stanceSheet against a brute-force walk", () => {
  const cyclic = graphArb({ moves: 5, stances: 3, acyclic: false });
  const withStance = cyclic
    .filter((g) => g.nodes.some((n) => n.kind === "stance"))
    .chain((g) =>
      fc.tuple(
        fc.constant(g),
        fc.constantFrom(...g.nodes.filter((n) => n.kind === "stance").map((n) => n.id)),
        optionsArb,
      ),
    );

  // The path "cancelled move → cancel → stance move", walked from the cancelled move by the
  // test's own re-statement of DESIGN.md's path semantics: its only step into a hit is the
  // stance move's, so its gaps, jail and natural combo are that cell's gap and combo on hit.
  test.prop([withStance], { numRuns: 200 })(
    "each cell's gap and combo are the walk's for that two-step path",
    ([g, s, o]) => {
      const sheet = stanceSheet(g, s, o);
      for (const cell of sheet.grid) {
        const from = sheet.waysIn.find((w) => w.cancel === cell.cancel)!.from;
        const path = oraclePaths(g, from, { ...o, maxDepth: Math.max(o.maxDepth, 3), maxStanceVisits: 2 }).find(
          (p) => p.edges.length === 2 && p.edges[0] === cell.cancel && p.edges[1] === cell.enter,
        );
        expect(path, `${cell.cancel} then ${cell.enter}`).toBeDefined();
        expect(path!.naturalCombo).toBe(cell.comboOnHit);
        expect(path!.jails).toBe(cell.gapOnBlock !== null && cell.gapOnBlock <= 0);
        expect(path!.gaps).toEqual(
          cell.gapOnBlock !== null && cell.gapOnBlock > 0 ? [{ after: 0, frames: cell.gapOnBlock }] : [],
        );
      }
    },
  );

  test.prop([withStance], { numRuns: 200 })(
    "every cancel into the stance is a way in, and every move from it a row",
    ([g, s]) => {
      const sheet = stanceSheet(g, s);
      expect(sheet.waysIn.map((w) => w.cancel).sort()).toEqual(
        g.edges
          .filter((e) => e.kind === "cancel" && e.to === s)
          .map((e) => e.id)
          .sort(),
      );
      expect(sheet.moves.map((m) => m.enter).sort()).toEqual(
        g.edges
          .filter((e) => e.kind === "enter" && e.from === s)
          .map((e) => e.id)
          .sort(),
      );
      expect(sheet.grid).toHaveLength(sheet.waysIn.length * sheet.moves.length);
    },
  );
});
