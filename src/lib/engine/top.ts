import type { CompiledGraph } from "./compile";
import type { ExploreOptions, MoveGraph, PathResult, PathView } from "./types";
import { PathWalker } from "./walk";

export interface TopOptions {
  k: number;
  /** Score to rank by; higher ranks first unless `order` is "asc". Ignored when `compare` is given. */
  by?: (path: PathView) => number;
  order?: "desc" | "asc";
  /** Negative when `a` ranks before `b`. */
  compare?: (a: PathView, b: PathView) => number;
  filter?: (path: PathView) => boolean;
}

interface Entry {
  score: number;
  seq: number;
  result: PathResult;
}

/**
 * The k best paths without keeping every path: a bounded heap whose root is the worst
 * path kept, and a path is materialised only when it beats that root. Ties keep walk
 * order, so the answer equals a stable sort of the full list cut at k.
 */
export function topPaths(
  graph: MoveGraph | CompiledGraph,
  rootId: string,
  { k, by, order = "desc", compare, filter }: TopOptions,
  options?: ExploreOptions,
): PathResult[] {
  if (!Number.isInteger(k) || k < 0) throw new RangeError(`k must be a whole number >= 0 (got ${k})`);
  if (compare === undefined && by === undefined) throw new TypeError("topPaths needs `by` or `compare`");
  const walker = new PathWalker(graph, rootId, options);
  if (k === 0) return [];
  const sign = order === "asc" ? -1 : 1;
  // `worse(a, b)` is true when a ranks after b; the heap keeps the worst entry on top.
  const worse = compare
    ? (a: Entry, b: Entry) => {
        const c = compare(a.result, b.result);
        return c > 0 || (c === 0 && a.seq > b.seq);
      }
    : (a: Entry, b: Entry) => a.score < b.score || (a.score === b.score && a.seq > b.seq);
  const heap: Entry[] = [];
  let seq = 0;
  while (walker.advance()) {
    const s = seq++;
    if (filter !== undefined && !filter(walker)) continue;
    const score = compare ? 0 : rankScore(by!(walker), sign);
    if (heap.length === k) {
      const top = heap[0]!;
      // A later path never beats an equal one already kept.
      const beats = compare ? compare(walker, top.result) < 0 : score > top.score;
      if (!beats) continue;
      heap[0] = { score, seq: s, result: walker.toResult() };
      siftDown(heap, 0, worse);
    } else {
      heap.push({ score, seq: s, result: walker.toResult() });
      siftUp(heap, heap.length - 1, worse);
    }
  }
  heap.sort((a, b) => (worse(a, b) ? 1 : worse(b, a) ? -1 : 0));
  return heap.map((e) => e.result);
}

/** NaN (no number to rank by) ranks last in either order. */
function rankScore(raw: number, sign: number): number {
  return raw === raw ? sign * raw : Number.NEGATIVE_INFINITY;
}

function siftUp(heap: Entry[], i: number, worse: (a: Entry, b: Entry) => boolean): void {
  while (i > 0) {
    const p = (i - 1) >> 1;
    if (!worse(heap[i]!, heap[p]!)) return;
    [heap[i], heap[p]] = [heap[p]!, heap[i]!];
    i = p;
  }
}

function siftDown(heap: Entry[], i: number, worse: (a: Entry, b: Entry) => boolean): void {
  for (;;) {
    const l = 2 * i + 1;
    const r = l + 1;
    let w = i;
    if (l < heap.length && worse(heap[l]!, heap[w]!)) w = l;
    if (r < heap.length && worse(heap[r]!, heap[w]!)) w = r;
    if (w === i) return;
    [heap[i], heap[w]] = [heap[w]!, heap[i]!];
    i = w;
  }
}

/** Ready-made rankings for the questions players ask most. */
export const rankings = {
  /** Best on-block advantage first; paths ending in a state outcome are left out. */
  safest: {
    by: (p: PathView) => (typeof p.onBlock === "number" ? p.onBlock : Number.NEGATIVE_INFINITY),
    filter: (p: PathView) => typeof p.onBlock === "number",
  },
  /** Most damaging natural combos first. */
  damagingCombos: {
    by: (p: PathView) => p.damage,
    filter: (p: PathView) => p.naturalCombo,
  },
} as const;
