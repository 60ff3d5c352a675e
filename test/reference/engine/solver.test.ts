import { fc } from "@fast-check/vitest";
import { beforeAll, describe, expect, test } from "vitest";
import { solveMatrixGame } from "../../../src/lib/engine";
import { highsValue as highsOf, loadHighs } from "./highs-game";

let highs: Awaited<ReturnType<typeof loadHighs>>;

beforeAll(async () => {
  highs = await loadHighs();
});

/** The row player's guaranteed payoff of mix `x` and the column player's of `y`. */
function guarantees(payoff: number[][], row: number[], col: number[]) {
  const cols = payoff[0]!.length;
  const rowFloor = Math.min(
    ...Array.from({ length: cols }, (_, j) => payoff.reduce((s, r, i) => s + r[j]! * row[i]!, 0)),
  );
  const colCeiling = Math.max(...payoff.map((r) => r.reduce((s, v, j) => s + v * col[j]!, 0)));
  return { rowFloor, colCeiling };
}

const highsValue = (payoff: number[][]) => highsOf(highs, payoff);

describe("solveMatrixGame", () => {
  test('the worked example of Wikipedia\'s "Zero-sum game" article', () => {
    // Source: Wikipedia, "Zero-sum game", section "Solving", example payoff matrix for the row player:
    // value 20/7, row mix (4/7, 3/7), column mix (0, 4/7, 3/7).
    const s = solveMatrixGame([
      [30, -10, 20],
      [-10, 20, -20],
    ]);
    expect(s.value).toBeCloseTo(20 / 7, 9);
    expect(s.row[0]).toBeCloseTo(4 / 7, 9);
    expect(s.row[1]).toBeCloseTo(3 / 7, 9);
    expect(s.col[0]).toBeCloseTo(0, 9);
    expect(s.col[1]).toBeCloseTo(4 / 7, 9);
    expect(s.col[2]).toBeCloseTo(3 / 7, 9);
  });

  test("rock-paper-scissors: value 0, every option a third (common practice, no source)", () => {
    const s = solveMatrixGame([
      [0, -1, 1],
      [1, 0, -1],
      [-1, 1, 0],
    ]);
    expect(s.value).toBeCloseTo(0, 9);
    for (const p of [...s.row, ...s.col]) expect(p).toBeCloseTo(1 / 3, 9);
  });

  test("agrees with HiGHS on 200 random matrices up to 8×8, and both mixes are optimal", () => {
    const matrix = fc.tuple(fc.integer({ min: 1, max: 8 }), fc.integer({ min: 1, max: 8 })).chain(([r, c]) =>
      fc.array(fc.array(fc.integer({ min: -60, max: 60 }), { minLength: c, maxLength: c }), {
        minLength: r,
        maxLength: r,
      }),
    );
    fc.assert(
      fc.property(matrix, (payoff) => {
        const s = solveMatrixGame(payoff);
        expect(Math.abs(s.value - highsValue(payoff))).toBeLessThan(1e-6);
        const { rowFloor, colCeiling } = guarantees(payoff, s.row, s.col);
        expect(rowFloor).toBeGreaterThan(s.value - 1e-6);
        expect(colCeiling).toBeLessThan(s.value + 1e-6);
        for (const mix of [s.row, s.col]) {
          expect(mix.every((p) => p >= -1e-9)).toBe(true);
          expect(mix.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 9);
        }
      }),
      { numRuns: 200 },
    );
  });
});
