import { describe, expect, test } from "vitest";
import { DEMO_CHARACTERS, DEMO_GAME, EDITIONS } from "@/server/db/seed/demo";
import { classifyBlock, explorePaths, parseGraph } from "@/lib/engine";
import { flatten, postureOf, toMoveGraph, type EdgeRow } from "@/server/db/seed/dsl";

const RULES = { fastest: DEMO_GAME.fastest, launchAt: DEMO_GAME.launchAt };

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

  test.each(EDITIONS.map((e) => e.slug))("edition %s is written in the demo game's own notation", (edition) => {
    const g = graph(character, edition);
    // The notation documented at the top of demo.ts: buttons n v t r c (pressed together written
    // together), directions press ebb sink rise joined by "+", hits joined by ".", cancels "~" + direction,
    // stance moves "<code>:<input>" with a lower-case code.
    const hit = "(?:(?:press|ebb|sink|rise)\\+)?[nvtrc]{1,2}";
    const codes = g.data.stances.map((s) => s.abbreviation).join("|");
    const move = new RegExp(`^(?:(?:${codes}):)?${hit}(?:\\.${hit})*$`);
    for (const m of g.moves) expect(m.key, m.hit.name).toMatch(move);
    for (const e of g.edges.filter((x) => x.kind === "cancel")) expect(e.input).toMatch(/^~(press|ebb|sink)$/);
    for (const s of g.data.stances) expect(s.abbreviation).toMatch(/^[a-z]+$/);
  });

  test.each(EDITIONS.map((e) => e.slug))("edition %s gives every hit a reach in metres", (edition) => {
    for (const m of graph(character, edition).moves) {
      expect(m.hit.range, m.key).toBeTypeOf("number");
      expect(m.hit.range, m.key).toBeGreaterThanOrEqual(0.5);
      expect(m.hit.range, m.key).toBeLessThanOrEqual(4);
    }
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
      return roots.flatMap((r) => explorePaths(g, r.id, RULES).map((p) => ({ ...p, moveById })));
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
    expect(cancels.some((p) => p.blockClass === "safe" && classifyBlock(before(p), RULES) === "punishable")).toBe(true);
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

describe("postureOf reads the demo notation", () => {
  test("down moves come out of a crouch too, rising moves only out of one, the rest from standing", () => {
    expect(postureOf("sink+r")).toBe("any");
    expect(postureOf("sink+n.v")).toBe("any");
    expect(postureOf("rise+t")).toBe("crouching");
    expect(postureOf("press+t.t.v")).toBe("standing");
    expect(postureOf("ebb+n")).toBe("standing");
    expect(postureOf("v.v.t")).toBe("standing");
    expect(postureOf("drift:v")).toBe("standing");
  });

  test("the demo's fastest attack and launch threshold are its own and fit its moves", () => {
    const starts = DEMO_CHARACTERS.flatMap((c) =>
      flatten(c.data("1-1")).moves.filter((m) => m.stance === null && m.hit.startup !== undefined),
    );
    // The opponent's fastest attack is the fastest neutral move any demo fighter has.
    expect(Math.min(...starts.map((m) => m.hit.startup as number))).toBe(DEMO_GAME.fastest);
    expect(DEMO_GAME.launchAt).toBeGreaterThan(DEMO_GAME.fastest);
  });
});
