import { fc, test } from "@fast-check/vitest";
import microdiff from "microdiff";
import { isDeepStrictEqual } from "node:util";
import { describe, expect } from "vitest";
import {
  compileGraph,
  diffGraphs,
  EngineInputError,
  explorePaths,
  type ExploreOptions,
  type FieldChange,
  type GraphDiff,
  type MoveGraph,
  type PathChange,
  type PathResult,
} from "../../../src/lib/engine";
import { createPathWalker } from "../../../src/lib/engine/walk";
import { cancel, enter, follow, move, stance } from "./fixtures";
import { applyFieldEdits, editedPairs, fieldEditArb, READ_BY_PATHS } from "./graph-edits";
import { graphArb, optionsArb } from "./random-graphs";

const NOTHING: GraphDiff = {
  nodes: { added: [], removed: [], changed: [] },
  edges: { added: [], removed: [], changed: [] },
  paths: [],
};

/** `graph` with the node or edge of that id replaced by `change(it)`. */
function edited(graph: MoveGraph, id: string, change: (item: Record<string, unknown>) => object): MoveGraph {
  const copy = structuredClone(graph);
  const swap = <T extends { id: string }>(items: T[]) => items.map((i) => (i.id === id ? (change({ ...i }) as T) : i));
  return { nodes: swap(copy.nodes), edges: swap(copy.edges) };
}

describe("what changed, worked by hand", () => {
  // 1 (high) ,2→ 1,2 (mid) ,3→ 1,2,3 (low).
  const string = (): MoveGraph => ({
    nodes: [
      move("a", "1", "high", { startup: 10, onBlock: 1, onHit: 8 }),
      move("b", "1,2", "mid", { onBlock: -8, onHit: 3 }),
      move("c", "1,2,3", "low", { onBlock: -13, onHit: { state: "knockdown" } }),
    ],
    edges: [
      follow("f1", "a", "b", ",2", { gapOnBlock: 0, comboOnHit: true }),
      follow("f2", "b", "c", ",3", { gapOnBlock: -1, comboOnHit: true }),
    ],
  });

  test("a second hit going from -8 to -12 on block turns the string stopped there from safe to punishable", () => {
    // The patch also gives it a note it had none of: present on one side only, so null before.
    const after = edited(string(), "b", (b) => ({ ...b, onBlock: -12, notes: "slower recovery" }));
    expect(diffGraphs(string(), after)).toEqual({
      nodes: {
        added: [],
        removed: [],
        changed: [
          {
            id: "b",
            changes: [
              { field: "notes", before: null, after: "slower recovery" },
              { field: "onBlock", before: -8, after: -12 },
            ],
          },
        ],
      },
      edges: { added: [], removed: [], changed: [] },
      // 1,2,3 still ends on the third hit's -13, so only 1,2 is listed.
      paths: [
        {
          root: "a",
          edges: ["f1"],
          input: "1,2",
          status: "changed",
          changes: [{ field: "blockClass", before: "safe", after: "punishable" }],
        },
      ],
    } satisfies GraphDiff);
  });

  // A follow-up's step is part of every path through it: each one's combo or jail goes with it.
  for (const [title, field, was, now, pathField] of [
    [
      "a follow-up that no longer combos on hit takes the natural combo from every path through it",
      "comboOnHit",
      true,
      false,
      "naturalCombo",
    ],
    ["a gap that opens before the second hit ends the jail of every path through it", "gapOnBlock", 0, 3, "jails"],
  ] as const) {
    test(title, () => {
      const after = edited(string(), "f1", (f) => ({ ...f, [field]: now }));
      const lost = [{ field: pathField, before: true, after: false }];
      expect(diffGraphs(string(), after)).toEqual({
        nodes: { added: [], removed: [], changed: [] },
        edges: { added: [], removed: [], changed: [{ id: "f1", changes: [{ field, before: was, after: now }] }] },
        paths: [
          { root: "a", edges: ["f1"], input: "1,2", status: "changed", changes: lost },
          { root: "a", edges: ["f1", "f2"], input: "1,2,3", status: "changed", changes: lost },
        ],
      } satisfies GraphDiff);
    });
  }

  test("a third hit replaced by another and a new single move: paths leave and arrive, each once", () => {
    const before = string();
    const after: MoveGraph = {
      nodes: [
        ...before.nodes.filter((n) => n.id !== "c"),
        move("d", "1,2,4", "mid", { onBlock: -4, onHit: 5 }),
        move("e", "2", "mid", { startup: 12, onBlock: -2, onHit: 4 }),
      ],
      edges: [before.edges[0]!, follow("f3", "b", "d", ",4", { gapOnBlock: 2, comboOnHit: false })],
    };
    expect(diffGraphs(before, after)).toEqual({
      nodes: { added: ["d", "e"], removed: ["c"], changed: [] },
      edges: { added: ["f3"], removed: ["f2"], changed: [] },
      paths: [
        { root: "a", edges: ["f1", "f2"], input: "1,2,3", status: "removed", changes: [] },
        { root: "a", edges: ["f1", "f3"], input: "1,2,4", status: "added", changes: [] },
        { root: "e", edges: [], input: "2", status: "added", changes: [] },
      ],
    } satisfies GraphDiff);
  });

  // 1 ~b into Coil: -1 on block, +12 on hit; from Coil, 2 with startup 10 combos (10 <= 12).
  const coil = (): MoveGraph => ({
    nodes: [
      move("a", "1", "mid", { startup: 12, onBlock: -3, onHit: 5 }),
      stance("s", "Coil"),
      move("x", "S 2", "mid", { startup: 10, onBlock: -6, onHit: 4 }),
    ],
    edges: [cancel("c1", "a", "s", "~b", { onBlock: -1, onHit: 12, onCounterHit: 14 }), enter("n1", "s", "x", "2")],
  });

  test("a stance cancel that gives less on hit and more on block changes both the cancel and the stance move after it", () => {
    const before = coil();
    const after = edited(before, "c1", (c) => ({ ...c, onBlock: 2, onHit: 8 }));
    expect(diffGraphs(before, after)).toEqual({
      nodes: { added: [], removed: [], changed: [] },
      edges: {
        added: [],
        removed: [],
        changed: [
          {
            id: "c1",
            changes: [
              { field: "onBlock", before: -1, after: 2 },
              { field: "onHit", before: 12, after: 8 },
            ],
          },
        ],
      },
      // The stance move ("x" from Coil) is a root of its own, unchanged; "a" ~b and "a" ~b 2 change.
      paths: [
        {
          root: "a",
          edges: ["c1"],
          input: "1~b",
          status: "changed",
          changes: [
            { field: "blockClass", before: "safe", after: "plus" },
            { field: "onHit", before: 12, after: 8 },
          ],
        },
        {
          root: "a",
          edges: ["c1", "n1"],
          input: "1~b2",
          status: "changed",
          changes: [{ field: "naturalCombo", before: true, after: false }],
        },
      ],
    } satisfies GraphDiff);
  });

  test("a stance move that starts slower no longer combos after the cancel, nor does anything after it", () => {
    // Then ,1 and ,2 after the stance move, whose startup goes from 10 to 14.
    const before = coil();
    before.nodes.push(
      move("y", "S 2,1", "high", { onBlock: -4, onHit: 3 }),
      move("z", "S 2,1,2", "low", { onBlock: -9, onHit: { state: "knockdown" } }),
    );
    before.edges.push(
      follow("f1", "x", "y", ",1", { gapOnBlock: 1, comboOnHit: true }),
      follow("f2", "y", "z", ",2", { gapOnBlock: 2, comboOnHit: true }),
    );
    const after = edited(before, "x", (x) => ({ ...x, startup: 14 }));
    const lost = [{ field: "naturalCombo", before: true, after: false }];
    expect(diffGraphs(before, after)).toEqual({
      nodes: { added: [], removed: [], changed: [{ id: "x", changes: [{ field: "startup", before: 10, after: 14 }] }] },
      edges: { added: [], removed: [], changed: [] },
      // From its own root "x" the stance move is the first hit, where startup decides nothing.
      paths: [
        { root: "a", edges: ["c1", "n1"], input: "1~b2", status: "changed", changes: lost },
        { root: "a", edges: ["c1", "n1", "f1"], input: "1~b2,1", status: "changed", changes: lost },
        { root: "a", edges: ["c1", "n1", "f1", "f2"], input: "1~b2,1,2", status: "changed", changes: lost },
      ],
    } satisfies GraphDiff);
  });

  test("a move that gains a follow-up into it stops being a root: its paths from there leave", () => {
    const before: MoveGraph = {
      nodes: [move("a", "1", "high"), move("b", "2", "mid")],
      edges: [],
    };
    const after: MoveGraph = { nodes: before.nodes, edges: [follow("f1", "a", "b", ",2")] };
    expect(diffGraphs(before, after).paths).toEqual([
      { root: "a", edges: ["f1"], input: "1,2", status: "added", changes: [] },
      { root: "b", edges: [], input: "2", status: "removed", changes: [] },
    ]);
  });

  test("the options reach both sides: -12 is only punishable while the fastest answer is 12 frames or less", () => {
    const after = edited(string(), "b", (b) => ({ ...b, onBlock: -12 }));
    expect(diffGraphs(string(), after, { fastest: 13 }).paths).toEqual([]);
  });

  test("an inconsistent graph or a bad option is refused with the offending id or option", () => {
    const broken: MoveGraph = { nodes: string().nodes, edges: [follow("f9", "a", "zz", ",9")] };
    expect(() => diffGraphs(string(), broken)).toThrow(EngineInputError);
    expect(() => diffGraphs(string(), broken)).toThrow(/"zz"/);
    expect(() => diffGraphs(string(), string(), { maxDepth: 0 })).toThrow(/maxDepth/);
  });
});

const graphs = graphArb({ moves: 6, stances: 3, acyclic: false });
const pairs = editedPairs(graphs);

const byCodeUnits = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
const sorted = (ids: Iterable<string>) => [...ids].sort(byCodeUnits);

describe("what changed on random graphs", () => {
  test.prop([graphs, optionsArb], { numRuns: 200 })("a graph against itself, in any order, changes nothing", (g, o) => {
    const shuffled: MoveGraph = { nodes: [...g.nodes].reverse(), edges: [...g.edges].reverse() };
    expect(diffGraphs(g, structuredClone(g), o)).toEqual(NOTHING);
    expect(diffGraphs(g, shuffled, o)).toEqual(NOTHING);
  });

  test.prop([graphs, fc.array(fieldEditArb, { minLength: 1, maxLength: 8 })], { numRuns: 300 })(
    "field edits are reported exactly: each edited field with its old and new value, no other",
    (g, fieldEdits) => {
      const { graph: after, edited: done } = applyFieldEdits(g, fieldEdits);
      const diff = diffGraphs(g, after);
      const expected = (node: boolean) => {
        const byId = new Map<string, FieldChange[]>();
        for (const e of done.filter((d) => d.node === node)) {
          const list = byId.get(e.id) ?? [];
          list.push({ field: e.field, before: e.before ?? null, after: e.after ?? null });
          byId.set(e.id, list);
        }
        return {
          added: [],
          removed: [],
          changed: sorted(byId.keys()).map((id) => ({
            id,
            changes: byId.get(id)!.sort((x, y) => byCodeUnits(x.field, y.field)),
          })),
        };
      };
      expect(diff.nodes).toEqual(expected(true));
      expect(diff.edges).toEqual(expected(false));
    },
  );

  test.prop([pairs], { numRuns: 300 })(
    "turned around, added and removed swap and every change swaps its before and after",
    ([a, b, o]) => {
      const forth = diffGraphs(a, b, o);
      const back = diffGraphs(b, a, o);
      const swapChanges = (changes: FieldChange[]) => changes.map((c) => ({ ...c, before: c.after, after: c.before }));
      const swapItems = (d: GraphDiff["nodes"]) => ({
        added: d.removed,
        removed: d.added,
        changed: d.changed.map((c) => ({ id: c.id, changes: swapChanges(c.changes) })),
      });
      expect(back.nodes).toEqual(swapItems(forth.nodes));
      expect(back.edges).toEqual(swapItems(forth.edges));
      const swapStatus = { added: "removed", removed: "added", changed: "changed" } as const;
      // A changed path's input is the after side's, so that one is left out of the comparison.
      const keyed = (paths: PathChange[]) =>
        new Map(
          paths.map((p) => [
            JSON.stringify([p.root, ...p.edges]),
            { status: p.status, changes: p.changes, input: p.status === "changed" ? null : p.input },
          ]),
        );
      const turned = forth.paths.map((p) => ({ ...p, status: swapStatus[p.status], changes: swapChanges(p.changes) }));
      expect(keyed(back.paths)).toEqual(keyed(turned));
    },
  );

  test.prop([pairs], { numRuns: 300 })(
    "the changed fields of every node and edge are those microdiff finds changed at the top level",
    ([a, b]) => {
      // Reference: microdiff (npm), an independent deep diff of two objects; the first step
      // of each difference's path is the top-level field it lies in.
      const diff = diffGraphs(a, b);
      for (const [ours, before, after] of [
        [diff.nodes, a.nodes, b.nodes],
        [diff.edges, a.edges, b.edges],
      ] as const) {
        const now = new Map<string, object>(after.map((item) => [item.id, item]));
        for (const item of before) {
          const other = now.get(item.id);
          if (other === undefined) continue;
          const theirs = new Set(microdiff(item, other).map((d) => String(d.path[0])));
          theirs.delete("id");
          const found = ours.changed.find((c) => c.id === item.id)?.changes.map((c) => c.field) ?? [];
          expect(new Set(found), item.id).toEqual(theirs);
        }
      }
    },
  );

  test.prop([pairs], { numRuns: 400 })(
    "the paths listed are those a plain comparison of every path on both sides finds",
    ([a, b, o]) => {
      expect(diffGraphs(a, b, o).paths).toEqual(naivePathDiff(a, b, o));
    },
  );

  // One or two edits of what the paths read leave most of the graph as it was, so the walk
  // skips much of it: this is where skipping too much would show.
  const fewEdits = graphs.chain((g) =>
    fc.tuple(
      fc.constant(g),
      fc.array(fieldEditArb, { minLength: 1, maxLength: 2 }).map((e) => applyFieldEdits(g, e, READ_BY_PATHS).graph),
      optionsArb,
    ),
  );

  test.prop([fewEdits], { numRuns: 400 })(
    "after one or two edits of the numbers paths read, the paths listed are those the plain comparison finds",
    ([a, b, o]) => {
      expect(diffGraphs(a, b, o).paths).toEqual(naivePathDiff(a, b, o));
    },
  );
  // With every edge's input one of two, most paths from a root share their input with others:
  // those are listed by their edge ids, which is where grouping equal inputs could go wrong.
  const twoInputs = (g: MoveGraph): MoveGraph => ({
    nodes: g.nodes,
    edges: g.edges.map((e) => ({
      ...e,
      input: [...e.id].reduce((sum, c) => sum + c.charCodeAt(0), 0) % 2 ? ",1" : "",
    })),
  });
  test.prop([pairs], { numRuns: 300 })(
    "when many paths share an input, the paths listed are those the plain comparison finds, in its order",
    ([a, b, o]) => {
      const [before, after] = [twoInputs(a), twoInputs(b)];
      expect(diffGraphs(before, after, o).paths).toEqual(naivePathDiff(before, after, o));
    },
  );

  // Edits of the endings alone (on block, on hit) leave every step clean: the paths that end on
  // an edited move are compared, and the rest are known to be the same without comparing.
  const endingEdits = graphs.chain((g) =>
    fc.tuple(
      fc.constant(g),
      fc
        .array(
          fieldEditArb.map((e) => ({ ...e, node: true })),
          { minLength: 1, maxLength: 3 },
        )
        .map((e) => applyFieldEdits(g, e, { ...READ_BY_PATHS, move: ["onBlock", "onHit"] }).graph),
      optionsArb,
    ),
  );
  test.prop([endingEdits], { numRuns: 300 })(
    "after edits of moves' endings only, the paths listed are those the plain comparison finds",
    ([a, b, o]) => {
      expect(diffGraphs(a, b, o).paths).toEqual(naivePathDiff(a, b, o));
    },
  );
});

/** A graph, a root move, any node of it, and options. */
const withRoot = graphs.chain((g) =>
  fc.tuple(
    fc.constant(g),
    fc.constantFrom(...g.nodes.filter((n) => n.kind === "move").map((n) => n.id)),
    fc.constantFrom(...g.nodes.map((n) => n.id)),
    optionsArb,
  ),
);

describe("the walk's skipExtensions", () => {
  test.prop([withRoot], { numRuns: 200 })(
    "leaves out exactly the paths that extend a path where it was called",
    ([g, root, at, o]) => {
      // Skipping below every path that ends at node `at` keeps those paths and drops all that go on from them.
      const walker = createPathWalker(g, root, o);
      const kept: string[] = [];
      while (walker.advance()) {
        kept.push(walker.edges.join(" "));
        if (walker.nodes[walker.nodes.length - 1] === at) walker.skipExtensions();
      }
      const expected = explorePaths(g, root, o)
        .filter((p) => !p.nodes.slice(0, -1).includes(at))
        .map((p) => p.edges.join(" "));
      expect(kept).toEqual(expected);
    },
  );
});

describe("the walk's passOver", () => {
  test.prop([withRoot], { numRuns: 200 })(
    "leaves out exactly the paths that step into the nodes it passes over",
    ([g, root, at, o]) => {
      const compiled = compileGraph(g);
      const walker = createPathWalker(compiled, root, o);
      walker.passOver((_d, _edge, to) => to === compiled.index.get(at));
      const kept: string[] = [];
      while (walker.advance()) kept.push(walker.edges.join(" "));
      const expected = explorePaths(g, root, o)
        .filter((p) => !p.nodes.slice(1).includes(at))
        .map((p) => p.edges.join(" "));
      expect(kept).toEqual(expected);
    },
  );
});

/**
 * The test's own "what changed" on paths: every path of both sides materialised with
 * explorePaths from the roots each side has, matched by root and edge ids, and the four
 * fields compared with node's isDeepStrictEqual. Sorted by root, input, then edge ids.
 */
function naivePathDiff(before: MoveGraph, after: MoveGraph, options: ExploreOptions): PathChange[] {
  const all = (g: MoveGraph) => {
    const followed = new Set(g.edges.filter((e) => e.kind === "follow").map((e) => e.to));
    const paths = new Map<string, PathResult & { root: string }>();
    for (const n of g.nodes) {
      if (n.kind !== "move" || followed.has(n.id)) continue;
      for (const p of explorePaths(g, n.id, options))
        paths.set(JSON.stringify([n.id, ...p.edges]), { root: n.id, ...p });
    }
    return paths;
  };
  const was = all(before);
  const now = all(after);
  const out: PathChange[] = [];
  for (const [key, p] of was) {
    if (!now.has(key)) out.push({ root: p.root, edges: [...p.edges], input: p.input, status: "removed", changes: [] });
  }
  for (const [key, p] of now) {
    const old = was.get(key);
    if (old === undefined) {
      out.push({ root: p.root, edges: [...p.edges], input: p.input, status: "added", changes: [] });
      continue;
    }
    const changes = (["blockClass", "onHit", "naturalCombo", "jails"] as const)
      .filter((f) => !isDeepStrictEqual(old[f], p[f]))
      .map((f) => ({ field: f, before: old[f], after: p[f] }));
    if (changes.length > 0) out.push({ root: p.root, edges: [...p.edges], input: p.input, status: "changed", changes });
  }
  const byEdges = (x: string[], y: string[]) => {
    for (let i = 0; i < Math.min(x.length, y.length); i++) if (x[i] !== y[i]) return byCodeUnits(x[i]!, y[i]!);
    return x.length - y.length;
  };
  return out.sort((x, y) => byCodeUnits(x.root, y.root) || byCodeUnits(x.input, y.input) || byEdges(x.edges, y.edges));
}
