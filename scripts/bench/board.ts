import { solveBoard, type Board, type BoardSituation } from "../../src/lib/engine";
import { highsValue, loadHighs } from "../../test/reference/engine/highs-game";
import { rng } from "./generate";

/**
 * The Mix-up board bench: a generated tree of 100 situations, each 6x6, solved with
 * `solveBoard` (yalps per situation), and the same 100 games solved bottom-up through HiGHS
 * (npm `highs`, through the reference tests' LP: test/reference/engine/highs-game.ts) in the same run. `npm run bench` prints
 * board_100x6x6_ms and board_100x6x6_highs_ms; alone: `npx tsx scripts/bench/board.ts`.
 */
const SITUATIONS = 100;
const SIZE = 6;
const SEED = 14;
const REPS = 15;

export interface BoardBench {
  situations: number;
  /** One per timed run of solveBoard, after one warm-up run. */
  times: number[];
  /** One per timed run of the same games through HiGHS. */
  highsTimes: number[];
  /** The largest difference between the two solvers' situation values. */
  largestGap: number;
}

/** A seeded tree: situation k's cells lead (about one in four) to a later situation that has no parent yet. */
export function generateBoard(seed = SEED, count = SITUATIONS): Board {
  const rand = rng(seed);
  const situations: BoardSituation[] = [];
  let nextChild = 1;
  for (let k = 0; k < count; k++) {
    const payoffs = Array.from({ length: SIZE }, () =>
      Array.from({ length: SIZE }, () => Math.round((rand() * 120 - 60) * 10) / 10),
    );
    const next = payoffs.map((row) => row.map(() => (nextChild < count && rand() < 0.25 ? `s${nextChild++}` : null)));
    situations.push({
      id: `s${k}`,
      name: `Situation ${k}`,
      rows: payoffs.map((_, i) => `r${i}`),
      cols: payoffs[0]!.map((_, j) => `c${j}`),
      payoffs,
      next,
    });
  }
  return { root: "s0", situations };
}

type Highs = Awaited<ReturnType<typeof loadHighs>>;

/** Every situation's value through HiGHS, the leaves first (a child's id is above its parent's). */
function solveWithHighs(highs: Highs, board: Board): Map<string, number> {
  const values = new Map<string, number>();
  for (let k = board.situations.length - 1; k >= 0; k--) {
    const s = board.situations[k]!;
    const effective = s.payoffs.map((row, i) =>
      row.map((x, j) => {
        const next = s.next?.[i]?.[j] ?? null;
        return next === null ? x : x + values.get(next)!;
      }),
    );
    values.set(s.id, highsValue(highs, effective));
  }
  return values;
}

function timed(run: () => void): number {
  globalThis.gc?.();
  const t0 = process.hrtime.bigint();
  run();
  return Number(process.hrtime.bigint() - t0) / 1e6;
}

export async function benchBoard(): Promise<BoardBench> {
  const highs = await loadHighs();
  const board = generateBoard();
  const ours = solveBoard(board);
  const theirs = solveWithHighs(highs, board);
  let largestGap = 0;
  for (const [id, v] of theirs) largestGap = Math.max(largestGap, Math.abs(ours.situations[id]!.value - v));
  const times: number[] = [];
  const highsTimes: number[] = [];
  // Interleaved, so both see the same machine load.
  for (let r = 0; r < REPS; r++) {
    times.push(timed(() => solveBoard(board)));
    highsTimes.push(timed(() => solveWithHighs(highs, board)));
  }
  return { situations: board.situations.length, times, highsTimes, largestGap };
}

if (process.argv[1]?.endsWith("board.ts") && process.argv[2] === undefined) {
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1]!;
  void benchBoard().then((r) => {
    console.log(
      `board ${r.situations}x${SIZE}x${SIZE}: solveBoard median ${median(r.times).toFixed(1)} ms (target < 50 ms), ` +
        `HiGHS ${median(r.highsTimes).toFixed(1)} ms, values agree to ${r.largestGap.toExponential(1)}`,
    );
  });
}
