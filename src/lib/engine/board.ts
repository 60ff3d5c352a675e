import { solveMatrixGame } from "./solver";
import type { Board, BoardSituation, BoardSolution, SituationSolution } from "./types";

/** The most attacker or defender options a situation may have (DESIGN.md, "Board contract"). */
export const MAX_BOARD_OPTIONS = 12;

/** A board the solver refuses; the message names the offending situation ids. */
export class BoardInputError extends Error {
  readonly issues: string[];
  constructor(issues: string[]) {
    super(issues.join("; "));
    this.name = "BoardInputError";
    this.issues = issues;
  }
}

/**
 * Solves a Mix-up board (DESIGN.md, "Board contract"): every situation from the leaves up,
 * each cell's payoff plus the value of the situation its `next` leads to, with
 * `solveMatrixGame`. Every situation is solved, reachable from the root or not; the board's
 * value is the root's. Throws `BoardInputError` for a board that cannot be solved.
 */
export function solveBoard(board: Board): BoardSolution {
  const byId = checkBoard(board);
  const solved: Record<string, SituationSolution> = {};
  for (const id of leavesFirst(board, byId)) {
    const s = byId.get(id)!;
    const cells = s.payoffs.map((row, i) =>
      row.map((payoff, j) => {
        const next = s.next?.[i]?.[j] ?? null;
        return next === null ? payoff : payoff + solved[next]!.value;
      }),
    );
    solved[id] = solveSituation(cells);
  }
  return { value: solved[board.root]!.value, situations: solved };
}

/**
 * Below this, a shortfall is the LP's rounding, not a worse option: 1e-9 of the situation's
 * largest payoff (of 1 when every payoff is within ±1), as yalps's error grows with the payoffs.
 */
function roundingOf(cells: readonly (readonly number[])[]): number {
  let largest = 1;
  for (const row of cells) for (const x of row) largest = Math.max(largest, Math.abs(x));
  return 1e-9 * largest;
}

/**
 * One situation's game on its effective payoffs, with the shortfalls of each option against
 * the other side's mix. A shortfall within rounding (`roundingOf`) is written as exactly 0:
 * a tiny negative one can only be rounding, and an option in its mix's support earns the
 * value exactly in theory, so its shortfall is 0 once rounding is taken off. A shortfall
 * beyond rounding is kept as it is (on a played option it would show a solver fault).
 */
function solveSituation(cells: number[][]): SituationSolution {
  const { value, row, col } = solveMatrixGame(cells);
  const rounding = roundingOf(cells);
  const settle = (x: number) => (Math.abs(x) < rounding ? 0 : x);
  const rowShortfall = cells.map((r) => {
    let earned = 0;
    for (let j = 0; j < r.length; j++) earned += r[j]! * col[j]!;
    return settle(value - earned);
  });
  const colShortfall = col.map((_, j) => {
    let conceded = 0;
    for (let i = 0; i < cells.length; i++) conceded += cells[i]![j]! * row[i]!;
    return settle(conceded - value);
  });
  return { value, row, col, cells, rowShortfall, colShortfall };
}

/**
 * If the defender always takes column `col`: the attacker's best row against it and what it
 * earns, on the effective payoffs (ties: the lowest row).
 */
export function bestReplyTo(solution: SituationSolution, col: number): { row: number; payoff: number } {
  const width = solution.cells[0]?.length ?? 0;
  if (!Number.isInteger(col) || col < 0 || col >= width) throw new RangeError(`column ${col} is not in the situation`);
  let best = { row: 0, payoff: solution.cells[0]![col]! };
  solution.cells.forEach((r, i) => {
    if (r[col]! > best.payoff) best = { row: i, payoff: r[col]! };
  });
  return best;
}

/**
 * If the attacker always takes row `row`: the defender's best column against it and what the
 * attacker then earns, on the effective payoffs (ties: the lowest column).
 */
export function bestAnswerTo(solution: SituationSolution, row: number): { col: number; payoff: number } {
  const cells = solution.cells[row];
  if (!Number.isInteger(row) || cells === undefined) throw new RangeError(`row ${row} is not in the situation`);
  let best = { col: 0, payoff: cells[0]! };
  cells.forEach((x, j) => {
    if (x < best.payoff) best = { col: j, payoff: x };
  });
  return best;
}

// ---------------------------------------------------------------------------------------
// Checks

function checkBoard(board: Board): Map<string, BoardSituation> {
  const issues: string[] = [];
  const byId = new Map<string, BoardSituation>();
  const repeated = new Set<string>();
  for (const s of board.situations) {
    if (byId.has(s.id)) repeated.add(s.id);
    else byId.set(s.id, s);
  }
  for (const id of repeated) issues.push(`situation id "${id}" is used more than once`);
  if (!byId.has(board.root)) issues.push(`root "${board.root}" is not a situation of the board`);
  for (const s of board.situations) issues.push(...situationIssues(s, byId));
  if (issues.length > 0) throw new BoardInputError(issues);
  const cycle = findCycle(board, byId);
  if (cycle !== null) {
    throw new BoardInputError([
      `situations ${cycle.map((id) => `"${id}"`).join(" → ")} lead back to each other through their next links`,
    ]);
  }
  return byId;
}

function situationIssues(s: BoardSituation, byId: ReadonlyMap<string, BoardSituation>): string[] {
  const issues: string[] = [];
  const name = `situation "${s.id}"`;
  for (const [side, list] of [
    ["attacker", s.rows],
    ["defender", s.cols],
  ] as const) {
    if (list.length === 0 || list.length > MAX_BOARD_OPTIONS) {
      issues.push(`${name} has ${list.length} ${side} options; it needs 1 to ${MAX_BOARD_OPTIONS}`);
    }
  }
  const shaped = (m: readonly (readonly unknown[])[]) =>
    m.length === s.rows.length && m.every((r) => r.length === s.cols.length);
  if (!shaped(s.payoffs)) {
    issues.push(`${name} needs ${s.rows.length} x ${s.cols.length} payoffs, one per attacker and defender option`);
  } else if (s.payoffs.some((r) => r.some((x) => !Number.isFinite(x)))) {
    issues.push(`${name} has a payoff that is not a finite number`);
  }
  if (s.next !== undefined) {
    if (!shaped(s.next)) {
      issues.push(`${name} needs ${s.rows.length} x ${s.cols.length} next links, one per attacker and defender option`);
    } else {
      const unknown = new Set(s.next.flat().filter((id): id is string => id !== null && !byId.has(id)));
      for (const id of unknown) issues.push(`${name} leads to "${id}", which is not a situation of the board`);
    }
  }
  return issues;
}

/** The situations each situation's cells lead to, in order, without repeats. */
function children(s: BoardSituation): string[] {
  const out = new Set<string>();
  for (const row of s.next ?? []) for (const id of row) if (id !== null) out.add(id);
  return [...out];
}

/** The ids on a cycle of next links (the first one again at the end), or null when there is none. */
function findCycle(board: Board, byId: ReadonlyMap<string, BoardSituation>): string[] | null {
  const state = new Map<string, "open" | "done">();
  const stack: string[] = [];
  const visit = (id: string): string[] | null => {
    state.set(id, "open");
    stack.push(id);
    for (const next of children(byId.get(id)!)) {
      const seen = state.get(next);
      if (seen === "open") return [...stack.slice(stack.indexOf(next)), next];
      if (seen === undefined) {
        const cycle = visit(next);
        if (cycle !== null) return cycle;
      }
    }
    stack.pop();
    state.set(id, "done");
    return null;
  };
  for (const s of board.situations) {
    if (state.has(s.id)) continue;
    const cycle = visit(s.id);
    if (cycle !== null) return cycle;
  }
  return null;
}

/** Every situation's id, each after all the situations its cells lead to. */
function leavesFirst(board: Board, byId: ReadonlyMap<string, BoardSituation>): string[] {
  const order: string[] = [];
  const placed = new Set<string>();
  const place = (id: string) => {
    if (placed.has(id)) return;
    placed.add(id);
    for (const next of children(byId.get(id)!)) place(next);
    order.push(id);
  };
  for (const s of board.situations) place(s.id);
  return order;
}
