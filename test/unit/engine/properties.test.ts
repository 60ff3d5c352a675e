import { fc, test } from "@fast-check/vitest";
import { describe, expect } from "vitest";
import {
  countPaths,
  explorePaths,
  explorePathsLimited,
  iteratePaths,
  rankings,
  topPaths,
  type MoveGraph,
  type PathResult,
} from "../../../src/lib/engine";
import { graphArb, oraclePaths, optionsArb } from "./random-graphs";

const cyclic = graphArb({ moves: 5, stances: 3, acyclic: false });
const key = (p: PathResult) => p.edges.join(" ");
const moveIds = (g: MoveGraph) => g.nodes.filter((n) => n.kind === "move").map((n) => n.id);
const rootArb = (g: MoveGraph) => fc.constantFrom(...moveIds(g));
const withRoot = cyclic.chain((g) => fc.tuple(fc.constant(g), rootArb(g), optionsArb));
const anyRoot = cyclic.chain((g) => fc.tuple(fc.constant(g), fc.constantFrom(...g.nodes.map((n) => n.id)), optionsArb));

describe("paths on random graphs with cycles", () => {
  test.prop([anyRoot], { numRuns: 300 })(
    "every path and every field equal a brute-force walk of the definitions",
    ([g, root, o]) => {
      expect(explorePaths(g, root, o)).toEqual(oraclePaths(g, root, o));
    },
  );

  test.prop([withRoot], { numRuns: 200 })("every path starts at the root and follows real edges", ([g, root, o]) => {
    const edges = new Map(g.edges.map((e) => [e.id, e]));
    for (const p of explorePaths(g, root, o)) {
      expect(p.nodes[0]).toBe(root);
      expect(p.nodes.length).toBe(p.edges.length + 1);
      p.edges.forEach((id, i) => {
        const e = edges.get(id);
        expect(e?.from).toBe(p.nodes[i]);
        expect(e?.to).toBe(p.nodes[i + 1]);
      });
    }
  });

  test.prop([withRoot], { numRuns: 200 })(
    "every stopping place is yielded exactly once and the count matches",
    ([g, root, o]) => {
      const paths = explorePaths(g, root, o);
      expect(new Set(paths.map(key)).size).toBe(paths.length);
      expect(paths.length).toBe(bruteCount(g, root, o.maxDepth, o.maxStanceVisits));
      // Every prefix of a path ending at a move or a stance is itself a stopping place.
      const keys = new Set(paths.map(key));
      for (const p of paths) expect(keys.has(p.edges.slice(0, -1).join(" "))).toBe(true);
    },
  );

  test.prop([withRoot], { numRuns: 200 })("no path exceeds the bounds", ([g, root, o]) => {
    const stances = new Set(g.nodes.filter((n) => n.kind === "stance").map((n) => n.id));
    for (const p of explorePaths(g, root, o)) {
      expect(p.levels.length).toBeLessThanOrEqual(o.maxDepth);
      const visits = new Map<string, number>();
      for (const n of p.nodes) if (stances.has(n)) visits.set(n, (visits.get(n) ?? 0) + 1);
      for (const v of visits.values()) expect(v).toBeLessThanOrEqual(o.maxStanceVisits);
    }
  });

  test.prop([withRoot], { numRuns: 200 })(
    "framesSaved is the cancel's on-block minus the last move's",
    ([g, root, o]) => {
      const byId = new Map(g.nodes.map((n) => [n.id, n]));
      for (const p of explorePaths(g, root, o)) {
        const before = byId.get(p.nodes[p.nodes.length - 2] ?? "");
        if (
          p.endsIn === "stance" &&
          before?.kind === "move" &&
          typeof before.onBlock === "number" &&
          typeof p.onBlock === "number"
        ) {
          expect(p.framesSaved).toBe(p.onBlock - before.onBlock);
        } else {
          expect(p.framesSaved).toBeNull();
        }
      }
    },
  );

  test.prop([withRoot, fc.nat(), fc.nat(), fc.subarray(["high", "mid", "low"] as const)], { numRuns: 200 })(
    "adding a cancel never removes a path",
    ([g, root, o], i, j, autoGuard) => {
      const moves = moveIds(g);
      const stances = g.nodes.filter((n) => n.kind === "stance").map((n) => n.id);
      const extra: MoveGraph = {
        nodes: stances.length > 0 ? g.nodes : [...g.nodes, { id: "sx", kind: "stance", name: "extra" }],
        edges: [
          ...g.edges,
          {
            id: "added",
            kind: "cancel",
            from: moves[i % moves.length]!,
            to: stances.length > 0 ? stances[j % stances.length]! : "sx",
            input: "~x",
            onBlock: -3,
            onHit: 2,
            onCounterHit: 4,
            autoGuard: [...autoGuard],
          },
        ],
      };
      const before = explorePaths(g, root, o).map(key);
      const after = new Set(explorePaths(extra, root, o).map(key));
      for (const k of before) expect(after.has(k)).toBe(true);
      expect(after.size).toBeGreaterThanOrEqual(before.length);
    },
  );

  test.prop([withRoot, fc.integer({ min: 0, max: 12 })], { numRuns: 200 })(
    "streaming, counting, limits and top-k agree with the full list",
    ([g, root, o], k) => {
      const full = explorePaths(g, root, o);
      const streamed = Array.from(iteratePaths(g, root, o), (c) => c.toResult());
      expect(streamed).toEqual(full);
      expect(countPaths(g, root, o)).toBe(full.length);
      expect(countPaths(g, root, o, (c) => c.naturalCombo)).toBe(full.filter((p) => p.naturalCombo).length);
      expect(explorePathsLimited(g, root, k + 1, o)).toEqual({
        paths: full.slice(0, k + 1),
        truncated: full.length > k + 1,
      });

      const stableDesc = (score: (p: PathResult) => number, list: PathResult[]) =>
        list
          .map((p, i) => ({ p, i, s: score(p) }))
          .sort((a, b) => b.s - a.s || a.i - b.i)
          .map((x) => x.p);
      expect(topPaths(g, root, { k, by: (p) => p.damage }, o)).toEqual(stableDesc((p) => p.damage, full).slice(0, k));
      expect(topPaths(g, root, { k, ...rankings.damagingCombos }, o)).toEqual(
        stableDesc(
          (p) => p.damage,
          full.filter((p) => p.naturalCombo),
        ).slice(0, k),
      );
      const numericBlock = full.filter((p) => typeof p.onBlock === "number");
      expect(topPaths(g, root, { k, ...rankings.safest }, o)).toEqual(
        stableDesc((p) => p.onBlock as number, numericBlock).slice(0, k),
      );
      expect(topPaths(g, root, { k, by: (p) => p.levels.length, order: "asc" }, o)).toEqual(
        stableDesc((p) => -p.levels.length, full).slice(0, k),
      );
      const byInput = (a: PathResult, b: PathResult) => (a.input < b.input ? -1 : a.input > b.input ? 1 : 0);
      expect(topPaths(g, root, { k, compare: byInput }, o).map((p) => p.input)).toEqual(
        [...full]
          .sort(byInput)
          .slice(0, k)
          .map((p) => p.input),
      );
    },
  );

  test.prop([withRoot], { numRuns: 100 })(
    "the streamed cursor reads the same as its materialised result",
    ([g, root, o]) => {
      for (const c of iteratePaths(g, root, o)) {
        const r = c.toResult();
        expect(c.length).toBe(r.nodes.length);
        expect(c.hitCount).toBe(r.levels.length);
        expect(c.gapCount).toBe(r.gaps.length);
        expect(Number.isNaN(c.onBlockFrames) ? null : c.onBlockFrames).toBe(
          typeof r.onBlock === "number" ? r.onBlock : null,
        );
      }
    },
  );
});

/** Counts stopping places by recursion over edge lists only. */
function bruteCount(g: MoveGraph, at: string, maxDepth: number, maxVisits: number): number {
  const kind = new Map(g.nodes.map((n) => [n.id, n.kind]));
  const go = (id: string, moves: number, visits: Record<string, number>): number => {
    let total = 1;
    for (const e of g.edges) {
      if (e.from !== id) continue;
      if (kind.get(e.to) === "move") {
        if (moves < maxDepth) total += go(e.to, moves + 1, visits);
      } else if ((visits[e.to] ?? 0) < maxVisits) {
        total += go(e.to, moves, { ...visits, [e.to]: (visits[e.to] ?? 0) + 1 });
      }
    }
    return total;
  };
  return go(at, 1, {});
}
