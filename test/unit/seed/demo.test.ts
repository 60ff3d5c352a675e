import { describe, expect, test } from "vitest";
import { DEMO_CHARACTERS, EDITIONS } from "@/server/db/seed/demo";
import { flatten, type EdgeRow, type MoveRow } from "@/server/db/seed/dsl";

// Block classes with the demo game's fastest attack (10) and launch threshold
// (15): common practice, no source; DESIGN.md writes them down.
const punishable = (a: number) => a <= -10;
const safe = (a: number) => a > -10 && a < 0;

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
  const hits = (key: string): number => 1 + Math.max(0, ...follows(key).map((e) => hits((e.to as { move: string }).move)));
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
});

describe("the demo scenario as a whole", () => {
  const all = DEMO_CHARACTERS.flatMap((c) => EDITIONS.map((e) => graph(c, e.slug)));
  const num = (o: MoveRow["hit"]["onBlock"]) => (typeof o === "number" ? o : null);

  test("has a string with a mid/low guess", () => {
    const found = all.some((g) =>
      g.moves.some((m) => {
        const next = new Set(g.follows(m.key).map((e) => g.move.get((e.to as { move: string }).move)?.hit.level));
        return next.has("mid") && next.has("low");
      }),
    );
    expect(found).toBe(true);
  });

  test("has a cancel that turns a punishable ending safe, and one that turns minus into plus", () => {
    const cancels = all.flatMap((g) =>
      g.edges
        .filter((e) => e.kind === "cancel")
        .map((e) => ({ before: num(g.move.get((e.from as { move: string }).move)!.hit.onBlock), after: num(e.cancel!.onBlock) })),
    );
    expect(cancels.some((c) => c.before !== null && c.after !== null && punishable(c.before) && safe(c.after))).toBe(true);
    expect(cancels.some((c) => c.before !== null && c.after !== null && c.before < 0 && c.after > 0)).toBe(true);
  });

  test("has a natural combo of three hits and a string with a gap", () => {
    const natural = all.some((g) =>
      g.moves.some((m) => {
        const chain = (key: string, n: number): boolean =>
          n >= 3 || g.follows(key).some((e) => e.follow!.comboOnHit && chain((e.to as { move: string }).move, n + 1));
        return chain(m.key, 1);
      }),
    );
    expect(natural).toBe(true);
    expect(all.some((g) => g.edges.some((e) => (e.follow?.gapOnBlock ?? 0) > 0))).toBe(true);
  });

  test("the two editions differ", () => {
    for (const c of DEMO_CHARACTERS) {
      const [a, b] = EDITIONS.map((e) => JSON.stringify(flatten(c.data(e.slug))));
      if (a !== b) return;
    }
    throw new Error("every character has the same data in both editions");
  });
});
