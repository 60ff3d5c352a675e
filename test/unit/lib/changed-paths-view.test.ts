import { test } from "@fast-check/vitest";
import { describe, expect, it } from "vitest";
import {
  changedPathRows,
  changedPathsViewSchema,
  changesSearch,
  DEFAULT_VIEW,
  viewChangedPaths,
  type ChangedPathRow,
  type ChangedPathsView,
} from "../../../src/lib/changes";
import { diffGraphs, explorePaths, type MoveGraph, type PathResult } from "../../../src/lib/engine";
import { editedPairs } from "../engine/graph-edits";
import { graphArb } from "../engine/random-graphs";

// The paths table's view (filter, sort, page) applies to every changed path, not to the page a
// coach happens to have open. Common practice for server-side tables, no source.

const PER_PAGE = 500;

const row = (n: number, over: Partial<ChangedPathRow> = {}): ChangedPathRow => ({
  root: "r",
  path: `e${n}`,
  input: `1,${String(n).padStart(4, "0")}`,
  status: "changed",
  before: { blockClass: "safe", onHit: 4, naturalCombo: false, jails: false },
  after: { blockClass: "safe", onHit: 4, naturalCombo: false, jails: false },
  changed: ["onHit"],
  ...over,
});

/** 1,200 changed paths in the diff's order; three further down are different. */
function rows(): ChangedPathRow[] {
  const all = Array.from({ length: 1200 }, (_, n) => row(n));
  all[650] = row(650, { status: "added", before: null, changed: [], input: "1,0650~zz" });
  all[700] = row(700, {
    after: { blockClass: "plus", onHit: 9, naturalCombo: true, jails: true },
    changed: ["blockClass", "naturalCombo", "jails"],
  });
  all[1100] = row(1100, { status: "removed", after: null, changed: [], input: "1,1100~zz" });
  return all;
}

const view = (over: Partial<ChangedPathsView>): ChangedPathsView => ({ ...DEFAULT_VIEW, ...over });
const inputs = (r: readonly ChangedPathRow[]) => r.map((x) => x.input);

describe("the changed paths under a view", () => {
  it("pages the diff's order when nothing is asked", () => {
    const shown = viewChangedPaths(rows(), DEFAULT_VIEW, PER_PAGE);
    expect(shown).toMatchObject({ matching: 1200, page: 1, pageCount: 3 });
    expect(shown.rows).toHaveLength(500);
    // The rows the filters below look for are not on the first page.
    expect(inputs(shown.rows).some((i) => i.includes("zz"))).toBe(false);
  });

  it("a filter finds rows that sit on later pages, and puts them on the first", () => {
    const text = viewChangedPaths(rows(), view({ q: "ZZ" }), PER_PAGE);
    expect(inputs(text.rows)).toEqual(["1,0650~zz", "1,1100~zz"]);
    expect(text).toMatchObject({ matching: 2, page: 1, pageCount: 1 });

    expect(inputs(viewChangedPaths(rows(), view({ change: "oneSide" }), PER_PAGE).rows)).toEqual([
      "1,0650~zz",
      "1,1100~zz",
    ]);
    expect(inputs(viewChangedPaths(rows(), view({ change: "added" }), PER_PAGE).rows)).toEqual(["1,0650~zz"]);
    expect(inputs(viewChangedPaths(rows(), view({ change: "removed" }), PER_PAGE).rows)).toEqual(["1,1100~zz"]);
    expect(inputs(viewChangedPaths(rows(), view({ change: "jails" }), PER_PAGE).rows)).toEqual(["1,0700"]);
    expect(viewChangedPaths(rows(), view({ change: "onHit" }), PER_PAGE).matching).toBe(1197);
    expect(viewChangedPaths(rows(), view({ change: "blockClass", q: "0700" }), PER_PAGE).matching).toBe(1);
  });

  it("sorts every row before cutting pages: the best ending on page 3 comes first", () => {
    const asc = viewChangedPaths(rows(), view({ sort: "blockClass" }), PER_PAGE);
    expect(asc.rows[0]!.input).toBe("1,0700");
    // Ties keep the diff's order.
    expect(inputs(asc.rows.slice(1, 4))).toEqual(["1,0000", "1,0001", "1,0002"]);

    const desc = viewChangedPaths(rows(), view({ sort: "input", dir: "desc", page: 1 }), PER_PAGE);
    expect(desc.rows[0]!.input).toBe("1,1199");
    const last = viewChangedPaths(rows(), view({ sort: "input", dir: "desc", page: 3 }), PER_PAGE);
    expect(inputs(last.rows).at(-1)).toBe("1,0000");
    expect(last.rows).toHaveLength(200);
  });

  it("orders outcomes on hit as the engine does (numbers up, then states), and flags no before yes", () => {
    const some = [
      row(1, { after: { onHit: { state: "knockdown" } } }),
      row(2, { after: { onHit: 7 } }),
      row(3, { after: { onHit: -2, naturalCombo: true } }),
    ];
    expect(inputs(viewChangedPaths(some, view({ sort: "onHit" }), PER_PAGE).rows)).toEqual([
      "1,0003",
      "1,0002",
      "1,0001",
    ]);
    expect(inputs(viewChangedPaths(some, view({ sort: "naturalCombo", dir: "desc" }), PER_PAGE).rows)[0]).toBe(
      "1,0003",
    );
  });

  it("puts rows whose value is unknown last, in either direction", () => {
    const some = [row(1, { after: {} }), row(2, { after: { blockClass: "plus" } }), row(3)];
    expect(inputs(viewChangedPaths(some, view({ sort: "blockClass" }), PER_PAGE).rows)).toEqual([
      "1,0002",
      "1,0003",
      "1,0001",
    ]);
    expect(inputs(viewChangedPaths(some, view({ sort: "blockClass", dir: "desc" }), PER_PAGE).rows)).toEqual([
      "1,0003",
      "1,0002",
      "1,0001",
    ]);
  });

  it("a page past the last shows the last", () => {
    expect(viewChangedPaths(rows(), view({ page: 99 }), PER_PAGE)).toMatchObject({ page: 3 });
    expect(viewChangedPaths([], view({ page: 4 }), PER_PAGE)).toMatchObject({ page: 1, pageCount: 1, matching: 0 });
  });
});

describe("the view in the address", () => {
  const parse = (search: string) => changedPathsViewSchema.parse(Object.fromEntries(new URLSearchParams(search)));

  it("reads back what it wrote, with the Editions first and defaults left out", () => {
    const v = view({ change: "jails", q: "1,2 f", sort: "onHit", dir: "desc", page: 3 });
    const search = changesSearch({ from: "1-0", to: "1-1" }, v);
    expect(search).toBe("?from=1-0&to=1-1&change=jails&q=1%2C2+f&sort=onHit&dir=desc&page=3");
    expect(parse(search)).toEqual(v);
    expect(changesSearch({ from: "1-0", to: "1-1" }, DEFAULT_VIEW)).toBe("?from=1-0&to=1-1");
  });

  it("falls back to the default for anything it cannot read", () => {
    expect(parse("change=everything&sort=damage&dir=up&page=-2&q=" + "x".repeat(500))).toEqual(DEFAULT_VIEW);
  });
});

describe("rows of a diff", () => {
  // Reference: every path of each side materialised with explorePaths, matched by root and edges.
  const graphs = graphArb({ moves: 6, stances: 3, acyclic: false });
  const pairs = editedPairs(graphs);
  const everyPath = (g: MoveGraph, options: Parameters<typeof explorePaths>[2]) => {
    const out = new Map<string, PathResult>();
    for (const n of g.nodes) {
      if (n.kind !== "move") continue;
      for (const p of explorePaths(g, n.id, options)) out.set(`${n.id} ${p.edges.join("|")}`, p);
    }
    return out;
  };
  const four = (p: PathResult | undefined) =>
    p && { blockClass: p.blockClass, onHit: p.onHit, naturalCombo: p.naturalCombo, jails: p.jails };

  test.prop([pairs], { numRuns: 200 })("carry both sides' four fields of every listed path", ([a, b, o]) => {
    const diff = diffGraphs(a, b, o);
    const was = everyPath(a, o);
    const now = everyPath(b, o);
    const rowsOf = changedPathRows(diff, a, b, o);
    expect(rowsOf).toHaveLength(diff.paths.length);
    for (const r of rowsOf) {
      const key = `${r.root} ${r.path}`;
      expect(r.before ?? undefined).toEqual(r.status === "added" ? undefined : four(was.get(key)));
      expect(r.after ?? undefined).toEqual(r.status === "removed" ? undefined : four(now.get(key)));
    }
  });
});
