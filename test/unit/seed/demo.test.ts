import { describe, expect, test } from "vitest";
import { DEMO_CHARACTERS, EDITIONS } from "@/server/db/seed/demo";
import { classifyBlock, explorePaths, parseGraph } from "@/lib/engine";
import { flatten, toMoveGraph, type EdgeRow } from "@/server/db/seed/dsl";

function graph(character: (typeof DEMO_CHARACTERS)[number], edition: (typeof EDITIONS)[number]["slug"]) {
  const data = character.data(edition);
  const { moves, edges } = flatten(data);
  const move = new Map(moves.map((m) => [m.key, m]));
  const out = new Map<string, EdgeRow[]>();
  for (const e of edges) {
    const from = "move" in e.from ? e.from.move : `stance:${e.from.stance}`;
    out.set(from, [...(out.get(from) ?? []), e]);
  }
  const follows = (key: string) => (out.get(key) ?? []).filter((e) => e.kind === "follow");
  const roots = moves.filter((m) => !edges.some((e) => e.kind === "follow" && "move" in e.to && e.to.move === m.key));
  /** Longest chain of hits from a move along follow edges. */
  const hits = (key: string): number =>
    1 + Math.max(0, ...follows(key).map((e) => hits((e.to as { move: string }).move)));
  const branches = (key: string): boolean =>
    (out.get(key) ?? []).length >= 2 || follows(key).some((e) => branches((e.to as { move: string }).move));
  return { data, moves, edges, move, out, follows, roots, hits, branches };
}

describe.each(DEMO_CHARACTERS.map((c) => [c.name, c] as const))("demo character %s", (_name, character) => {
  test.each(EDITIONS.map((e) => e.slug))("edition %s has the shape the explorer needs", (edition) => {
    const g = graph(character, edition);
    expect(g.moves.length).toBeGreaterThanOrEqual(25);

    const strings = g.roots.filter((r) => g.hits(r.key) >= 3 && g.hits(r.key) <= 5 && g.branches(r.key));
    expect(strings.length).toBeGreaterThanOrEqual(6);

    expect(g.data.stances.length).toBeGreaterThanOrEqual(2);
    for (const stance of g.data.stances) {
      const into = g.edges.filter((e) => e.kind === "cancel" && "stance" in e.to && e.to.stance === stance.key);
      const from = g.edges.filter((e) => e.kind === "enter" && "stance" in e.from && e.from.stance === stance.key);
      expect(into.length, `cancels into ${stance.name}`).toBeGreaterThan(0);
      expect(from.length, `moves from ${stance.name}`).toBeGreaterThan(0);
    }
    expect(g.edges.some((e) => (e.cancel?.autoGuard.length ?? 0) > 0)).toBe(true);
  });

  test.each(EDITIONS.map((e) => e.slug))("edition %s is a graph the engine accepts", (edition) => {
    const parsed = parseGraph(toMoveGraph(character.data(edition)));
    expect(parsed.error?.issues ?? []).toEqual([]);
  });
});

describe("the demo scenario as a whole, read through the engine", () => {
  // Every path from every root of every character in both editions.
  const paths = DEMO_CHARACTERS.flatMap((c) =>
    EDITIONS.flatMap((e) => {
      const g = toMoveGraph(c.data(e.slug));
      const targets = new Set(g.edges.map((edge) => edge.to));
      const roots = g.nodes.filter((n) => n.kind === "move" && !targets.has(n.id));
      const moveById = new Map(g.nodes.map((n) => [n.id, n]));
      return roots.flatMap((r) => explorePaths(g, r.id).map((p) => ({ ...p, moveById })));
    }),
  );

  test("has a string with a mid/low guess", () => {
    const guess = paths.some((p) =>
      p.mixupPoints.some((point) => {
        const i = p.nodes.indexOf(point);
        const next = p.nodes[i + 1];
        const levels = paths
          .filter((q) => q.nodes[i] === point && q.nodes.length > i + 1 && q.nodes[0] === p.nodes[0])
          .map((q) => q.levels[i + 1]);
        return next !== undefined && levels.includes("mid") && levels.includes("low");
      }),
    );
    expect(guess).toBe(true);
  });

  test("has a cancel that turns a punishable ending safe, and one that turns minus into plus", () => {
    const cancels = paths.filter((p) => p.endsIn === "stance" && p.framesSaved !== null);
    const before = (p: (typeof cancels)[number]) => (p.onBlock as number) - (p.framesSaved as number);
    expect(cancels.some((p) => p.blockClass === "safe" && classifyBlock(before(p)) === "punishable")).toBe(true);
    expect(cancels.some((p) => p.blockClass === "plus" && before(p) < 0)).toBe(true);
  });

  test("has a natural combo of three hits and a string with a gap the defender can act in", () => {
    expect(paths.some((p) => p.naturalCombo && p.levels.length >= 3)).toBe(true);
    expect(paths.some((p) => p.gaps.length > 0 && p.endsIn === "move")).toBe(true);
  });

  test("the two editions differ", () => {
    const differs = DEMO_CHARACTERS.some((c) => {
      const [a, b] = EDITIONS.map((e) => JSON.stringify(flatten(c.data(e.slug))));
      return a !== b;
    });
    expect(differs).toBe(true);
  });
});
