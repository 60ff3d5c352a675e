import { fc, test } from "@fast-check/vitest";
import { beforeAll, describe, expect } from "vitest";
import { solveBoard, type Board, type BoardSituation } from "../../../src/lib/engine";
import { highsValue as highsOf, loadHighs } from "./highs-game";

let highs: Awaited<ReturnType<typeof loadHighs>>;

beforeAll(async () => {
  highs = await loadHighs();
});

const highsValue = (payoff: number[][]) => highsOf(highs, payoff);

function oneSituation(payoffs: number[][]): Board {
  return {
    root: "s1",
    situations: [
      {
        id: "s1",
        name: "Only",
        rows: payoffs.map((_, i) => `r${i}`),
        cols: payoffs[0]!.map((_, j) => `c${j}`),
        payoffs,
      },
    ],
  };
}

describe("solveBoard against known games", () => {
  test("a 2x2 game without a saddle point matches the closed form", () => {
    // Closed form for 2x2 games without a saddle point, common practice, no source:
    // v = (ad - bc)/(a + d - b - c), attacker's p(row 0) = (d - c)/(a + d - b - c),
    // defender's q(col 0) = (d - b)/(a + d - b - c).
    const [a, b, c, d] = [3, -1, -2, 4];
    // No saddle point: the best row floor (-1) is below the best column ceiling (3).
    const s = solveBoard(
      oneSituation([
        [a, b],
        [c, d],
      ]),
    );
    const den = a + d - b - c;
    expect(s.value).toBeCloseTo((a * d - b * c) / den, 9);
    expect(s.situations.s1!.row[0]).toBeCloseTo((d - c) / den, 9);
    expect(s.situations.s1!.col[0]).toBeCloseTo((d - b) / den, 9);
  });

  test.prop(
    [
      fc
        .tuple(fc.integer({ min: -50, max: 50 }), fc.integer({ min: -50, max: 50 }))
        .map(([p, q]) => [Math.max(p, q) + 1, Math.min(p, q) - 1] as const),
      fc.integer({ min: 1, max: 30 }),
      fc.integer({ min: 1, max: 30 }),
    ],
    { numRuns: 100 },
  )("random 2x2 games without a saddle point match the closed form (same form, no source)", ([hi, lo], x, y) => {
    // a and d on the diagonal above b and c on the other: a mixed game, never a saddle point.
    const [a, b, c, d] = [hi + x, lo, lo - y, hi];
    const s = solveBoard(
      oneSituation([
        [a, b],
        [c, d],
      ]),
    );
    const den = a + d - b - c;
    expect(Math.abs(s.value - (a * d - b * c) / den)).toBeLessThan(1e-9);
    expect(Math.abs(s.situations.s1!.row[0]! - (d - c) / den)).toBeLessThan(1e-9);
  });

  test("rock-paper-scissors: value 0, every option a third (common practice, no source)", () => {
    const s = solveBoard(
      oneSituation([
        [0, -1, 1],
        [1, 0, -1],
        [-1, 1, 0],
      ]),
    );
    expect(s.value).toBeCloseTo(0, 9);
    for (const p of [...s.situations.s1!.row, ...s.situations.s1!.col]) expect(p).toBeCloseTo(1 / 3, 9);
  });

  test('the worked example of Wikipedia\'s "Zero-sum game" article as a one-situation board', () => {
    // Source: Wikipedia, "Zero-sum game", section "Solving": value 20/7, row mix (4/7, 3/7),
    // column mix (0, 4/7, 3/7).
    const s = solveBoard(
      oneSituation([
        [30, -10, 20],
        [-10, 20, -20],
      ]),
    );
    expect(s.value).toBeCloseTo(20 / 7, 9);
    const only = s.situations.s1!;
    expect(only.row[0]).toBeCloseTo(4 / 7, 9);
    expect(only.col[0]).toBeCloseTo(0, 9);
    expect(only.col[1]).toBeCloseTo(4 / 7, 9);
    // Column 0 is never played: against the row mix it concedes 30·4/7 - 10·3/7 = 90/7, 70/7 above the value.
    expect(only.colShortfall[0]).toBeCloseTo(70 / 7, 9);
  });
});

/**
 * A random board whose next links only point to situations later in generation order, so
 * they form a tree or a DAG; the list is then shuffled so the solver must find the order.
 */
const treeBoard = fc
  .integer({ min: 1, max: 8 })
  .chain((count) =>
    fc.tuple(
      fc.tuple(
        ...Array.from({ length: count }, (_, k) =>
          fc.tuple(fc.integer({ min: 1, max: 6 }), fc.integer({ min: 1, max: 6 })).chain(([r, c]) =>
            fc.record({
              payoffs: fc.array(fc.array(fc.integer({ min: -60, max: 60 }), { minLength: c, maxLength: c }), {
                minLength: r,
                maxLength: r,
              }),
              next: fc.array(
                fc.array(
                  k + 1 < count
                    ? fc.option(fc.integer({ min: k + 1, max: count - 1 }), { freq: 2 })
                    : fc.constant(null),
                  { minLength: c, maxLength: c },
                ),
                { minLength: r, maxLength: r },
              ),
            }),
          ),
        ),
      ),
      fc.array(fc.nat(), { minLength: count, maxLength: count }),
    ),
  )
  .map(([generated, order]): Board => {
    const situations: BoardSituation[] = generated.map((g, k) => ({
      id: `s${k}`,
      name: `Situation ${k}`,
      rows: g.payoffs.map((_, i) => `r${i}`),
      cols: g.payoffs[0]!.map((_, j) => `c${j}`),
      payoffs: g.payoffs,
      next: g.next.map((row) => row.map((n) => (n === null ? null : `s${n}`))),
    }));
    const shuffled = situations
      .map((s, k) => ({ s, key: order[k]! }))
      .sort((x, y) => x.key - y.key)
      .map((x) => x.s);
    return { root: "s0", situations: shuffled };
  });

describe("solveBoard against HiGHS", () => {
  test.prop([treeBoard], { numRuns: 200 })(
    "200 random tree boards up to 6x6, solved bottom-up with HiGHS per situation: every value within 1e-6",
    (board) => {
      const solution = solveBoard(board);
      // Independent bottom-up: situation k only leads to situations after it, so solve from the last.
      const byId = new Map(board.situations.map((s) => [s.id, s]));
      const values = new Map<string, number>();
      for (let k = board.situations.length - 1; k >= 0; k--) {
        const s = byId.get(`s${k}`)!;
        const effective = s.payoffs.map((row, i) =>
          row.map((x, j) => {
            const next = s.next![i]![j];
            return next === null ? x : x + values.get(next!)!;
          }),
        );
        values.set(s.id, highsValue(effective));
      }
      for (const [id, v] of values) expect(Math.abs(solution.situations[id]!.value - v), id).toBeLessThan(1e-6);
      expect(Math.abs(solution.value - values.get("s0")!)).toBeLessThan(1e-6);
    },
  );
});
