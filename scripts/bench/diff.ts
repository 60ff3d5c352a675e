import { compileGraph, countPaths, diffGraphs, type MoveGraph } from "../../src/lib/engine";
import { generateGraph } from "./generate";
import { patchGraph } from "./patch";

/**
 * The generated character "what changed" is timed on: 299 moves, stances in bands with no
 * cycle. With cycles the same generator gives some 10^7 paths per side for 300 moves at the
 * default bounds, and a tenth of its moves changed would list millions of paths.
 */
const CHARACTER = { stances: 9, seed: 4, acyclic: true };
const PATCH_SEED = 1;
const REPS = 9;

export interface DiffBench {
  moves: number;
  pathsBefore: number;
  pathsAfter: number;
  listed: number;
  /** One per timed run, after one warm-up run. */
  times: number[];
}

function pathsFromRoots(graph: MoveGraph): number {
  const followed = new Set(graph.edges.filter((e) => e.kind === "follow").map((e) => e.to));
  const compiled = compileGraph(graph);
  let count = 0;
  for (const node of graph.nodes)
    if (node.kind === "move" && !followed.has(node.id)) count += countPaths(compiled, node.id);
  return count;
}

/** Two Editions of the character, the second a balance patch of the first (patch.ts), diffed with the default options. */
export function benchDiff(): DiffBench {
  const before = generateGraph(CHARACTER.stances, CHARACTER.seed, CHARACTER.acyclic);
  const after = patchGraph(before, PATCH_SEED);
  const listed = diffGraphs(before, after).paths.length;
  const times: number[] = [];
  for (let r = 0; r < REPS; r++) {
    globalThis.gc?.();
    const t0 = process.hrtime.bigint();
    diffGraphs(before, after);
    times.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  return {
    moves: before.nodes.filter((n) => n.kind === "move").length,
    pathsBefore: pathsFromRoots(before),
    pathsAfter: pathsFromRoots(after),
    listed,
    times,
  };
}
