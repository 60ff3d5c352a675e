import * as compiled from "../../src/lib/engine/compile";
import type { CompiledGraph } from "../../src/lib/engine/compile";

// A module-local copy, so the limit does not pay for tsx's import getters.
const CANCEL = compiled.CANCEL;

/**
 * The limit: the same depth-first walk over the same stopping places with the same bounds,
 * on the same compiled arrays, doing nothing but count. `sample` (if any) runs every
 * 16384 paths so the memory pass can watch the heap.
 */
export function bareWalk(
  g: CompiledGraph,
  root: number,
  maxDepth: number,
  maxVisits: number,
  sample?: () => void,
): number {
  const size = 2 * maxDepth + 2;
  const sNode = new Int32Array(size);
  const sNext = new Int32Array(size);
  const sMoves = new Int32Array(size);
  const visits = new Int32Array(g.nodeCount);
  const { slotStart, slotKind, slotTo, isMove } = g;
  sNode[0] = root;
  sNext[0] = slotStart[root]!;
  sMoves[0] = 1;
  let count = 1;
  let d = 0;
  while (d >= 0) {
    const n = sNode[d]!;
    const end = slotStart[n + 1]!;
    let slot = sNext[d]!;
    let pushed = false;
    while (slot < end) {
      const to = slotTo[slot]!;
      const kind = slotKind[slot]!;
      slot++;
      if (kind === CANCEL) {
        if (visits[to]! < maxVisits) {
          visits[to]!++;
          sNext[d] = slot;
          sMoves[d + 1] = sMoves[d]!;
          pushed = true;
          break;
        }
      } else if (sMoves[d]! < maxDepth) {
        sNext[d] = slot;
        sMoves[d + 1] = sMoves[d]! + 1;
        pushed = true;
        break;
      }
    }
    if (pushed) {
      d++;
      sNode[d] = slotTo[slot - 1]!;
      sNext[d] = slotStart[sNode[d]!]!;
      count++;
      if (sample !== undefined && (count & 16383) === 0) sample();
      continue;
    }
    if (!isMove[n]) visits[n]!--;
    d--;
  }
  return count;
}
