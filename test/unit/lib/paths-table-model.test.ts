import { describe, expect, test } from "vitest";
import { explorePaths, type MoveGraph, type Outcome } from "@/lib/engine";
import { compareOutcome, filterPaths, NO_FILTERS, type PathFilters } from "@/lib/paths-filter";

// An invented string: 4 ,1 (or ,3), and ,1 cancels ~f into a stance with one move, 1.
const graph: MoveGraph = {
  nodes: [
    { id: "r", kind: "move", input: "4", level: "mid", damage: 8, startup: 13, onBlock: 2, onHit: 5, onCounterHit: 7 },
    {
      id: "m",
      kind: "move",
      input: "4,1",
      level: "high",
      damage: 10,
      onBlock: -16,
      onHit: { state: "knockdown" },
      onCounterHit: { state: "knockdown" },
    },
    {
      id: "l",
      kind: "move",
      input: "4,3",
      level: "low",
      damage: 14,
      onBlock: -11,
      onHit: { state: "launch" },
      onCounterHit: { state: "launch" },
    },
    { id: "Z", kind: "stance", name: "Tilt" },
    {
      id: "z",
      kind: "move",
      input: "Z 1",
      level: "mid",
      damage: 18,
      startup: 12,
      onBlock: -8,
      onHit: { state: "wall-splat", frames: 10 },
      onCounterHit: 4,
    },
  ],
  edges: [
    {
      id: "rm",
      kind: "follow",
      from: "r",
      to: "m",
      input: ",1",
      gapOnBlock: 0,
      comboOnHit: true,
      comboOnCounterHit: true,
    },
    {
      id: "rl",
      kind: "follow",
      from: "r",
      to: "l",
      input: ",3",
      gapOnBlock: 3,
      comboOnHit: false,
      comboOnCounterHit: true,
    },
    {
      id: "mZ",
      kind: "cancel",
      from: "m",
      to: "Z",
      input: "~f",
      onBlock: -3,
      onHit: 6,
      onCounterHit: 6,
      autoGuard: [],
    },
    { id: "Zz", kind: "enter", from: "Z", to: "z", input: "1" },
  ],
};

const paths = explorePaths(graph, "r");
const inputs = (f: Partial<PathFilters>) => filterPaths(paths, { ...NO_FILTERS, ...f }).map((p) => p.input);

describe("filterPaths", () => {
  test("the invented string has the paths the filters are tested against", () => {
    expect(paths.map((p) => p.input)).toEqual(["4", "4,1", "4,1~f", "4,1~f1", "4,3"]);
  });

  test("with nothing set, every path stays, in walk order", () => {
    expect(filterPaths(paths, NO_FILTERS)).toEqual(paths);
  });

  test("ending class keeps only paths of that class", () => {
    expect(inputs({ blockClass: "punishable" })).toEqual(["4,3"]);
    expect(inputs({ blockClass: "launch-punishable" })).toEqual(["4,1"]);
    expect(inputs({ blockClass: "safe" })).toEqual(["4,1~f", "4,1~f1"]);
    expect(inputs({ blockClass: "even" })).toEqual([]);
  });

  test("minimum damage is inclusive", () => {
    expect(inputs({ minDamage: 22 })).toEqual(["4,1~f1", "4,3"]);
    expect(inputs({ minDamage: 23 })).toEqual(["4,1~f1"]);
  });

  test("on-hit outcome tells numbers from each state", () => {
    expect(inputs({ onHit: "numeric" })).toEqual(["4", "4,1~f"]);
    expect(inputs({ onHit: "knockdown" })).toEqual(["4,1"]);
    expect(inputs({ onHit: "wall-splat" })).toEqual(["4,1~f1"]);
    expect(inputs({ onHit: "crumple" })).toEqual([]);
  });

  test("stance-only and natural-combo-only combine with the rest", () => {
    expect(inputs({ stanceOnly: true })).toEqual(["4,1~f"]);
    // The stance move starts in 12f but the cancel is only +6 on hit: no combo from there.
    expect(inputs({ naturalOnly: true })).toEqual(["4", "4,1", "4,1~f"]);
    expect(inputs({ naturalOnly: true, minDamage: 15 })).toEqual(["4,1", "4,1~f"]);
  });
});

describe("compareOutcome", () => {
  test("orders numbers ascending and puts every state after them", () => {
    const sorted = paths.map((p) => p.onHit).sort(compareOutcome);
    expect(sorted).toEqual([5, 6, { state: "knockdown" }, { state: "launch" }, { state: "wall-splat", frames: 10 }]);
  });

  test("a state is never ahead of a number, however negative", () => {
    const launch: Outcome = { state: "launch" };
    expect(compareOutcome(-30, launch)).toBeLessThan(0);
    expect(compareOutcome(launch, -30)).toBeGreaterThan(0);
  });

  test("one state orders by the number it carries, one without a number first", () => {
    const bare: Outcome = { state: "knockdown" };
    const plus3: Outcome = { state: "knockdown", frames: 3 };
    const minus2: Outcome = { state: "knockdown", frames: -2 };
    expect([plus3, bare, minus2].sort(compareOutcome)).toEqual([bare, minus2, plus3]);
    expect(compareOutcome(bare, { state: "knockdown" })).toBe(0);
  });
});
