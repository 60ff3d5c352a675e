import { describe, expect, it } from "vitest";
import { changedPathRows, summariseChanges, summaryPhrases } from "../../../src/lib/changes";
import { blockClassTrend } from "../../../src/lib/engine";
import { diffGraphs, type MoveGraph } from "../../../src/lib/engine";
import { cancel, follow, move, stance } from "../engine/fixtures";

// Worked by hand from DESIGN.md's block classes (fastest 10, launchAt 15: safe is -9..-1,
// punishable -14..-10, launch-punishable -15 and below) and its natural-combo rule.
// Before: 1 (+1) ,2→ 1,2 (-8, safe; the follow-up combos on hit), 1 ~b into stance S (-3),
//         3 (-16, launch-punishable).
// After:  1,2 at -12 (punishable) and its follow-up no longer combos on hit; 3 at -6 (safe);
//         4 is new (+2); the cancel is gone.
const before: MoveGraph = {
  nodes: [
    move("1", "1", "high", { startup: 10, onBlock: 1, onHit: 8 }),
    move("1,2", "1,2", "mid", { onBlock: -8, onHit: 3 }),
    move("3", "3", "mid", { startup: 12, onBlock: -16, onHit: 5 }),
    stance("stance:S"),
  ],
  edges: [
    follow("1>1,2", "1", "1,2", ",2", { comboOnHit: true }),
    cancel("1~S", "1", "stance:S", "~b", { onBlock: -3, onHit: 4 }),
  ],
};
const after: MoveGraph = {
  nodes: [
    move("1", "1", "high", { startup: 10, onBlock: 1, onHit: 8 }),
    move("1,2", "1,2", "mid", { onBlock: -12, onHit: 3 }),
    move("3", "3", "mid", { startup: 12, onBlock: -6, onHit: 5 }),
    move("4", "4", "low", { startup: 14, onBlock: 2, onHit: 6 }),
    stance("stance:S"),
  ],
  edges: [follow("1>1,2", "1", "1,2", ",2", { comboOnHit: false })],
};

describe("summariseChanges, worked example", () => {
  const diff = diffGraphs(before, after, { fastest: 10, launchAt: 15 });
  const summary = summariseChanges(diff, before, after);

  it("counts moves, links and paths", () => {
    expect(summary.moves).toEqual({ added: 1, removed: 0, changed: 2 });
    expect(summary.stances).toEqual({ added: 0, removed: 0, changed: 0 });
    expect(summary.links).toEqual({ added: 0, removed: 1, changed: 1 });
    // Changed: 1,2 (class and combo) and 3 (class). Added: 4. Removed: 1~b.
    expect(summary.paths).toEqual({ added: 1, removed: 1, changed: 2 });
  });

  it("sorts block-class moves into worse and better, and counts lost combos", () => {
    expect(summary.endings.worse).toBe(1);
    expect(summary.endings.better).toBe(1);
    expect(summary.endings.shifts).toEqual([
      { from: "launch-punishable", to: "safe", count: 1 },
      { from: "safe", to: "punishable", count: 1 },
    ]);
    expect(summary.naturalCombos).toEqual({ lost: 1, gained: 0 });
    expect(summary.jails).toEqual({ lost: 0, gained: 0 });
  });

  it("says it in words", () => {
    expect(summaryPhrases(summary)).toEqual([
      "2 moves changed",
      "1 move added",
      "2 follow-ups or cancels changed",
      "1 ending that was launch-punishable is now safe",
      "1 ending that was safe is now punishable",
      "1 natural combo lost",
      "1 new path",
      "1 path gone",
    ]);
  });

  it("says nothing when nothing changed", () => {
    const same = summariseChanges(diffGraphs(before, before), before, before);
    expect(summaryPhrases(same)).toEqual([]);
  });

  it("fills both sides of each row from the graphs", () => {
    const rows = changedPathRows(diff, before, after, { fastest: 10, launchAt: 15 });
    const row = rows.find((r) => r.input === "1,2")!;
    expect(row).toMatchObject({
      root: "1",
      path: "1>1,2",
      status: "changed",
      before: { blockClass: "safe", onHit: 3, naturalCombo: true, jails: true },
      after: { blockClass: "punishable", onHit: 3, naturalCombo: false, jails: true },
      changed: ["blockClass", "naturalCombo"],
    });
    expect(rows.find((r) => r.input === "4")).toMatchObject({ status: "added", before: null });
    expect(rows.find((r) => r.input === "1~b")).toMatchObject({
      status: "removed",
      before: { blockClass: "safe", onHit: 4 },
      after: null,
    });
  });

  it("keeps the diff's fields when the budget runs out", () => {
    const rows = changedPathRows(diff, before, after, { fastest: 10, launchAt: 15 }, 0);
    expect(rows.find((r) => r.input === "1,2")).toMatchObject({
      before: { blockClass: "safe", naturalCombo: true },
      after: { blockClass: "punishable", naturalCombo: false },
    });
  });
});

describe("blockClassTrend", () => {
  it("ranks numbers' classes and leaves states unranked", () => {
    expect(blockClassTrend("safe", "punishable")).toBe(1);
    expect(blockClassTrend("punishable", "plus")).toBe(-1);
    expect(blockClassTrend("safe", "state")).toBe(0);
  });
});
