import { describe, expect, test } from "vitest";
import { boardDocumentSchema, boardToSolve, cellIsOverridden, newSituationId, type BoardDocument } from "@/lib/board";
import { DEFAULT_VALUE_TABLE, cellPayoff, solveBoard, type CellBasis } from "@/lib/engine";

// An invented board: a guess after a blocked string, whose low leads on to a second guess.
const low: CellBasis = { kind: "hit", input: "1,2,4", damage: 15, outcome: 2, counterHit: false };
const punished: CellBasis = {
  kind: "blocked",
  input: "1,2,4",
  onBlock: -12,
  defenderStance: "crouching",
  punisher: { input: "d+1", startup: 10, damage: 5 },
};

function doc(): BoardDocument {
  return boardDocumentSchema.parse({
    root: "s1",
    values: DEFAULT_VALUE_TABLE,
    situations: [
      {
        id: "s1",
        name: "After 1,2 on block",
        note: "",
        rows: ["1,2,4", "Stop"],
        cols: ["Stand guard", "Crouch guard"],
        cells: [
          [
            { basis: low, override: null, next: "s2" },
            { basis: punished, override: -9, next: null },
          ],
          [
            { basis: null, override: null, next: null },
            { basis: null, override: 4, next: null },
          ],
        ],
      },
      {
        id: "s2",
        name: "After the low",
        note: "",
        rows: ["Go on"],
        cols: ["Hold"],
        cells: [[{ basis: null, override: 3, next: null }]],
      },
    ],
  });
}

describe("boardToSolve", () => {
  test("a cell's payoff is its override, else its basis through the value table, else 0; next links are kept", () => {
    const board = boardToSolve(doc());
    expect(board.root).toBe("s1");
    expect(board.situations[0]!.payoffs).toEqual([
      [cellPayoff(low, DEFAULT_VALUE_TABLE), -9],
      [0, 4],
    ]);
    expect(board.situations[0]!.payoffs[0]![0]).toBe(17);
    expect(board.situations[0]!.next).toEqual([
      ["s2", null],
      [null, null],
    ]);
    // The low's 17 plus the child's 3 against the overridden -9: solvable as it stands.
    expect(solveBoard(board).situations.s1!.cells[0]).toEqual([expect.closeTo(20, 9), -9]);
  });

  test("a changed value table moves every cell filled from the engine, and no overridden one", () => {
    const d = doc();
    d.values = { ...d.values, plusFrame: 5 };
    const payoffs = boardToSolve(d).situations[0]!.payoffs;
    expect(payoffs[0]![0]).toBe(15 + 2 * 5);
    expect(payoffs[0]![1]).toBe(-9);
  });

  test("cellIsOverridden", () => {
    const cells = doc().situations[0]!.cells;
    expect(cellIsOverridden(cells[0]![0]!)).toBe(false);
    expect(cellIsOverridden(cells[0]![1]!)).toBe(true);
    expect(cellIsOverridden({ basis: null, override: 0, next: null })).toBe(true);
  });
});

describe("newSituationId", () => {
  test("one more than the highest sN in use, never one in use", () => {
    expect(newSituationId(doc())).toBe("s3");
    const situations = doc().situations.map((s, i) => ({ ...s, id: ["s7", "guess"][i]! }));
    expect(newSituationId({ situations })).toBe("s8");
    expect(newSituationId({ situations: situations.map((s) => ({ ...s, id: "x" })) })).toBe("s1");
    const huge = situations.map((s, i) => ({ ...s, id: ["s99999999999999999999", "s1"][i]! }));
    expect(newSituationId({ situations: huge })).toBe("s2");
  });
});
