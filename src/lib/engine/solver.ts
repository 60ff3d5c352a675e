import { solve, type Model } from "yalps";

export interface MatrixGameSolution {
  /** The game's value for the row player (the attacker). */
  value: number;
  /** The row player's optimal mix, one probability per row. */
  row: number[];
  /** The column player's (defender's) optimal mix, one probability per column. */
  col: number[];
}

/**
 * Solves a zero-sum game given the row player's payoffs.
 *
 * LP variables are non-negative, so the matrix is shifted (and scaled) into [1, 2]; the
 * shifted game has a positive value v', and the classic substitution u = x / v' turns
 * "maximise the guaranteed payoff" into "minimise sum(u) subject to u·A >= 1". The column
 * player's mix comes from the dual LP the same way. yalps rounds its answers to its
 * precision, so the value is read back from the two mixes on the original payoffs: the row
 * mix guarantees at least its worst column, the column mix concedes at most its worst row,
 * and the value lies between the two; the midpoint is within rounding of both.
 */
export function solveMatrixGame(payoff: readonly (readonly number[])[]): MatrixGameSolution {
  const rows = payoff.length;
  const cols = payoff[0]?.length ?? 0;
  if (rows === 0 || cols === 0) throw new RangeError("a matrix game needs at least one row and one column");
  let min = Infinity;
  let max = -Infinity;
  for (const [i, r] of payoff.entries()) {
    if (r.length !== cols) throw new RangeError(`row ${i} has ${r.length} entries, expected ${cols}`);
    for (const x of r) {
      if (!Number.isFinite(x)) throw new RangeError(`row ${i} holds a payoff that is not a finite number`);
      if (x < min) min = x;
      if (x > max) max = x;
    }
  }
  // Keeping every entry near 1 keeps the LP's variables near 1 too, where rounding is smallest.
  const scale = max > min ? max - min : 1;
  const at = (i: number, j: number) => 1 + (payoff[i]![j]! - min) / scale;

  const rowModel: Model<number, number> = {
    direction: "minimize",
    objective: -1,
    constraints: Array.from({ length: cols }, (_, j) => [j, { min: 1 }] as const),
    variables: Array.from({ length: rows }, (_, i) => {
      const coefs: [number, number][] = [[-1, 1]];
      for (let j = 0; j < cols; j++) coefs.push([j, at(i, j)]);
      return [i, coefs] as const;
    }),
  };
  const colModel: Model<number, number> = {
    direction: "maximize",
    objective: -1,
    constraints: Array.from({ length: rows }, (_, i) => [i, { max: 1 }] as const),
    variables: Array.from({ length: cols }, (_, j) => {
      const coefs: [number, number][] = [[-1, 1]];
      for (let i = 0; i < rows; i++) coefs.push([i, at(i, j)]);
      return [j, coefs] as const;
    }),
  };

  const row = mixFrom(solve(rowModel, LP_OPTIONS), rows);
  const col = mixFrom(solve(colModel, LP_OPTIONS), cols);
  let rowFloor = Infinity;
  for (let j = 0; j < cols; j++) {
    let v = 0;
    for (let i = 0; i < rows; i++) v += payoff[i]![j]! * row[i]!;
    if (v < rowFloor) rowFloor = v;
  }
  let colCeiling = -Infinity;
  for (let i = 0; i < rows; i++) {
    let v = 0;
    for (let j = 0; j < cols; j++) v += payoff[i]![j]! * col[j]!;
    if (v > colCeiling) colCeiling = v;
  }
  return { value: (rowFloor + colCeiling) / 2, row, col };
}

const LP_OPTIONS = { precision: 1e-12 } as const;

function mixFrom(solution: ReturnType<typeof solve<number>>, size: number): number[] {
  if (solution.status !== "optimal") {
    // Both LPs are feasible and bounded once every payoff is positive; anything else is a solver fault.
    throw new Error(`matrix game LP ended as ${solution.status}`);
  }
  const raw = new Array<number>(size).fill(0);
  for (const [k, v] of solution.variables) raw[k] = v;
  const total = raw.reduce((a, b) => a + b, 0);
  return raw.map((v) => v / total);
}
