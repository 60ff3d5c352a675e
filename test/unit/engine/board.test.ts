import { fc, test } from "@fast-check/vitest";
import { describe, expect } from "vitest";
import {
  BoardInputError,
  bestAnswerTo,
  bestReplyTo,
  solveBoard,
  type Board,
  type BoardSituation,
  type SituationSolution,
} from "../../../src/lib/engine";

// Properties of zero-sum games that any correct solver has (common practice, no source).

const matrixOf = (values: fc.Arbitrary<number>) =>
  fc
    .tuple(fc.integer({ min: 1, max: 6 }), fc.integer({ min: 1, max: 6 }))
    .chain(([r, c]) => fc.array(fc.array(values, { minLength: c, maxLength: c }), { minLength: r, maxLength: r }));
const matrix = matrixOf(fc.integer({ min: -60, max: 60 }));
/** Payoffs spread over many values, so ties (and games with several optimal mixes) are rare. */
const generic = matrixOf(fc.noBias(fc.integer({ min: -600_000, max: 600_000 })).map((x) => x / 10_000));

function situation(id: string, payoffs: number[][], next?: (string | null)[][]): BoardSituation {
  return {
    id,
    name: `Situation ${id}`,
    rows: payoffs.map((_, i) => `r${i}`),
    cols: (payoffs[0] ?? []).map((_, j) => `c${j}`),
    payoffs,
    ...(next === undefined ? {} : { next }),
  };
}

const solveOne = (payoffs: number[][]) => solveBoard({ root: "a", situations: [situation("a", payoffs)] });
const only = (payoffs: number[][]) => solveOne(payoffs).situations.a!;

/** A root whose cells may lead to two leaves; every matrix random. */
const smallTree = fc.tuple(matrix, matrix, matrix).chain(([root, left, right]) =>
  fc
    .array(
      fc.array(fc.constantFrom(null, "left", "right"), { minLength: root[0]!.length, maxLength: root[0]!.length }),
      {
        minLength: root.length,
        maxLength: root.length,
      },
    )
    .map((next): Board => ({
      root: "root",
      situations: [situation("root", root, next), situation("left", left), situation("right", right)],
    })),
);

const support = (mix: number[]) => mix.map((p, i) => (p > 1e-7 ? i : -1)).filter((i) => i >= 0);

function checkSolution(s: SituationSolution) {
  for (const mix of [s.row, s.col]) {
    expect(mix.every((p) => p >= 0)).toBe(true);
    expect(Math.abs(mix.reduce((a, b) => a + b, 0) - 1)).toBeLessThan(1e-9);
  }
  // No pure reply beats the value: the defender's columns against the attacker's mix, the
  // attacker's rows against the defender's mix.
  s.cells[0]!.forEach((_, j) => {
    const conceded = s.cells.reduce((sum, row, i) => sum + row[j]! * s.row[i]!, 0);
    expect(conceded).toBeGreaterThan(s.value - 1e-6);
  });
  for (const row of s.cells) {
    expect(row.reduce((sum, x, j) => sum + x * s.col[j]!, 0)).toBeLessThan(s.value + 1e-6);
  }
  for (const [shortfall, mix] of [
    [s.rowShortfall, s.row],
    [s.colShortfall, s.col],
  ] as const) {
    shortfall.forEach((x, i) => {
      expect(x).toBeGreaterThanOrEqual(-1e-9);
      if (mix[i]! > 1e-9) expect(x).toBe(0);
    });
  }
}

describe("solveBoard: properties of one situation", () => {
  test.prop([matrix, fc.integer({ min: -100, max: 100 })], { numRuns: 100 })(
    "adding c to every cell adds c to the value",
    (payoffs, c) => {
      const shifted = only(payoffs.map((r) => r.map((x) => x + c)));
      expect(Math.abs(shifted.value - (only(payoffs).value + c))).toBeLessThan(1e-6);
    },
  );

  test.prop([matrix, fc.integer({ min: 1, max: 40 }).map((k) => k / 4)], { numRuns: 100 })(
    "scaling every cell by k > 0 scales the value by k",
    (payoffs, k) => {
      const scaled = only(payoffs.map((r) => r.map((x) => x * k)));
      expect(Math.abs(scaled.value - only(payoffs).value * k)).toBeLessThan(1e-6 * Math.max(1, k));
    },
  );

  test.prop([generic, fc.nat(), fc.array(fc.integer({ min: 1, max: 50 }), { minLength: 6, maxLength: 6 })], {
    numRuns: 100,
  })("adding a dominated row changes neither the value nor the mixes' support", (payoffs, pick, less) => {
    const base = payoffs[pick % payoffs.length]!;
    const dominated = base.map((x, j) => x - less[j]!);
    const before = only(payoffs);
    const after = only([...payoffs, dominated]);
    expect(Math.abs(after.value - before.value)).toBeLessThan(1e-6);
    expect(after.row[payoffs.length]).toBeLessThan(1e-9);
    expect(support(after.row)).toEqual(support(before.row));
    expect(support(after.col)).toEqual(support(before.col));
  });

  test.prop([matrix], { numRuns: 200 })("the value lies between the pure maximin and the pure minimax", (payoffs) => {
    const maximin = Math.max(...payoffs.map((r) => Math.min(...r)));
    const minimax = Math.min(...payoffs[0]!.map((_, j) => Math.max(...payoffs.map((r) => r[j]!))));
    const { value } = only(payoffs);
    expect(value).toBeGreaterThan(maximin - 1e-6);
    expect(value).toBeLessThan(minimax + 1e-6);
  });

  test.prop([matrix], { numRuns: 200 })(
    "each mix is a probability vector, no pure reply beats the value, shortfalls are >= 0 and 0 where played",
    (payoffs) => checkSolution(only(payoffs)),
  );

  test.prop([matrix, fc.nat()], { numRuns: 100 })(
    "bestReplyTo and bestAnswerTo name the best pure reply, ties to the lowest index",
    (payoffs, pick) => {
      const s = only(payoffs);
      const j = pick % payoffs[0]!.length;
      const column = payoffs.map((r) => r[j]!);
      const reply = bestReplyTo(s, j);
      expect(reply.payoff).toBe(Math.max(...column));
      expect(reply.row).toBe(column.indexOf(reply.payoff));
      const i = pick % payoffs.length;
      const answer = bestAnswerTo(s, i);
      expect(answer.payoff).toBe(Math.min(...payoffs[i]!));
      expect(answer.col).toBe(payoffs[i]!.indexOf(answer.payoff));
    },
  );
});

describe("solveBoard: a board of situations", () => {
  test("a cell's next situation adds its value, and every situation is solved, reachable or not", () => {
    // Invented: after a guess (root), a follow-up guess (child) worth 2 on its own.
    const board: Board = {
      root: "root",
      situations: [
        situation(
          "root",
          [
            [0, 5],
            [3, 1],
          ],
          [
            [null, "child"],
            [null, null],
          ],
        ),
        situation("child", [
          [4, 0],
          [0, 4],
        ]),
        situation("stray", [[-7]]),
      ],
    };
    const s = solveBoard(board);
    expect(s.situations.child!.value).toBeCloseTo(2, 9);
    expect(s.situations.root!.cells).toEqual([
      [0, expect.closeTo(7, 9)],
      [3, 1],
    ]);
    // [[0, 7], [3, 1]]: closed form (0·1 - 7·3) / (0 + 1 - 7 - 3) = 21/9.
    expect(s.value).toBeCloseTo(21 / 9, 9);
    expect(s.situations.stray!.value).toBeCloseTo(-7, 9);
  });

  test.prop([smallTree], { numRuns: 100 })(
    "every situation of a tree board is a correct solution of its effective payoffs",
    (board) => {
      const s = solveBoard(board);
      for (const id of ["root", "left", "right"]) checkSolution(s.situations[id]!);
      const root = board.situations[0]!;
      root.payoffs.forEach((row, i) =>
        row.forEach((x, j) => {
          const next = root.next![i]![j];
          const expected = next === null ? x : x + s.situations[next!]!.value;
          expect(s.situations.root!.cells[i]![j]).toBe(expected);
        }),
      );
      expect(s.value).toBe(s.situations.root!.value);
    },
  );
});

describe("solveBoard refuses a bad board and names the situations", () => {
  const two = [
    [1, 2],
    [3, 4],
  ];
  const refusal = (board: Board): BoardInputError => {
    try {
      solveBoard(board);
    } catch (e) {
      expect(e).toBeInstanceOf(BoardInputError);
      return e as BoardInputError;
    }
    throw new Error("the board was not refused");
  };

  test("an unknown root", () => {
    expect(refusal({ root: "nowhere", situations: [situation("a", two)] }).message).toMatch(/root "nowhere"/);
  });

  test("an unknown next id", () => {
    const board = {
      root: "a",
      situations: [
        situation("a", two, [
          [null, "ghost"],
          [null, null],
        ]),
      ],
    };
    expect(refusal(board).message).toMatch(/situation "a" leads to "ghost"/);
  });

  test("a duplicate id", () => {
    const e = refusal({ root: "a", situations: [situation("a", two), situation("b", two), situation("b", [[1]])] });
    expect(e.message).toMatch(/"b" is used more than once/);
  });

  test("a cycle of next links names the ids on the cycle, and only those", () => {
    const link = (to: string) => [[to]];
    const board: Board = {
      root: "start",
      situations: [
        situation("start", [[0]], link("x")),
        situation("x", [[0]], link("y")),
        situation("y", [[0]], link("z")),
        situation("z", [[0]], link("x")),
      ],
    };
    const e = refusal(board);
    expect(e.message).toMatch(/"x" → "y" → "z" → "x"/);
    expect(e.message).not.toMatch(/start/);
    expect(refusal({ root: "self", situations: [situation("self", [[1]], link("self"))] }).message).toMatch(
      /"self" → "self"/,
    );
  });

  test("ragged payoffs and ragged next links", () => {
    const ragged = { ...situation("r", two), payoffs: [[1, 2], [3]] };
    expect(refusal({ root: "r", situations: [ragged] }).message).toMatch(/situation "r" needs 2 x 2 payoffs/);
    const short = { ...situation("n", two), next: [[null, null]] };
    expect(refusal({ root: "n", situations: [short] }).message).toMatch(/situation "n" needs 2 x 2 next links/);
  });

  test("more than 12 options, or none", () => {
    const wide = situation("wide", [Array.from({ length: 13 }, () => 0)]);
    expect(refusal({ root: "wide", situations: [wide] }).message).toMatch(/situation "wide" has 13 defender options/);
    const tall = situation(
      "tall",
      Array.from({ length: 13 }, () => [0]),
    );
    expect(refusal({ root: "tall", situations: [tall] }).message).toMatch(/situation "tall" has 13 attacker options/);
    const empty = situation("empty", []);
    expect(refusal({ root: "empty", situations: [empty] }).message).toMatch(/situation "empty" has 0 attacker options/);
  });

  test("a payoff that is not a finite number", () => {
    for (const bad of [Number.NaN, Infinity, -Infinity]) {
      const board = { root: "a", situations: [situation("a", [[1, bad]])] };
      expect(refusal(board).message).toMatch(/situation "a" has a payoff that is not a finite number/);
    }
  });

  test("every problem is named at once, each with its situation", () => {
    const e = refusal({
      root: "top",
      situations: [situation("a", [[Number.NaN]]), situation("b", [[1]], [["c"]])],
    });
    expect(e.issues).toHaveLength(3);
    expect(e.message).toMatch(/root "top"/);
    expect(e.message).toMatch(/situation "a"/);
    expect(e.message).toMatch(/situation "b" leads to "c"/);
  });

  test("bestReplyTo refuses a column that is not there", () => {
    const s = only(two);
    expect(() => bestReplyTo(s, 2)).toThrow(RangeError);
    expect(() => bestAnswerTo(s, -1)).toThrow(RangeError);
  });
});
