import { describe, expect, test } from "vitest";
import { solveMatrixGame } from "../../../src/lib/engine";

describe("solveMatrixGame on small boards", () => {
  test("a dominant attacker option is played every time", () => {
    // Row 0 beats row 1 against every defender answer.
    const s = solveMatrixGame([
      [5, 3],
      [2, 1],
    ]);
    expect(s.row[0]).toBeCloseTo(1, 9);
    expect(s.col[1]).toBeCloseTo(1, 9);
    expect(s.value).toBeCloseTo(3, 9);
  });

  test("a single cell is its own value, negative payoffs included", () => {
    expect(solveMatrixGame([[-7]])).toEqual({ value: expect.closeTo(-7, 9), row: [1], col: [1] });
  });

  test("a 50-50 strike/throw guess", () => {
    // Invented: a low (12 damage) or a throw (12); a crouching guard stops the low and eats the throw.
    const s = solveMatrixGame([
      [-10, 12],
      [12, -4],
    ]);
    // Solve by hand: p(-10) + (1-p)12 = p(12) + (1-p)(-4) => p = 16/38.
    expect(s.row[0]).toBeCloseTo(16 / 38, 9);
    expect(s.value).toBeCloseTo((16 / 38) * -10 + (22 / 38) * 12, 9);
  });

  test("malformed boards are refused", () => {
    expect(() => solveMatrixGame([])).toThrow(RangeError);
    expect(() => solveMatrixGame([[1, 2], [3]])).toThrow(/row 1/);
    expect(() => solveMatrixGame([[1, Number.NaN]])).toThrow(RangeError);
  });
});
