import { describe, expect, test } from "vitest";
import { stanceSheet, type MoveGraph } from "@/lib/engine";
import { tracePath } from "@/lib/permalink";
import { wayInPaths } from "@/lib/stance-sheet";
import { cancel, enter, follow, move, stance } from "./fixtures";

// Each way in of a stance sheet opens in the Explorer on a path that ends in it: the string's
// first move, then follow edges, then the cancel (DESIGN.md, "Path semantics": a path is its edges).
describe("wayInPaths", () => {
  test("walks back through follow edges to the string's first move; a stance move is a root", () => {
    const graph: MoveGraph = {
      nodes: [
        move("1", "1", "high"),
        move("1,2", "1,2", "mid"),
        move("1,2,3", "1,2,3", "mid"),
        move("4", "4", "mid"),
        stance("stance:s", "S"),
        move("S:1", "1", "low", { startup: 12 }),
      ],
      edges: [
        follow("f1", "1", "1,2", ",2"),
        follow("f2", "1,2", "1,2,3", ",3"),
        // A second way into 1,2,3 from elsewhere: the first in the graph's order is taken.
        follow("f3", "4", "1,2,3", ",3"),
        cancel("c1", "1,2,3", "stance:s", "~b", { onBlock: -1, onHit: 8 }),
        cancel("c2", "1", "stance:s", "~f", { onBlock: -3, onHit: 6 }),
        enter("e1", "stance:s", "S:1", "1"),
        cancel("c3", "S:1", "stance:s", "~b", { onBlock: -5, onHit: 5 }),
      ],
    };
    const sheet = stanceSheet(graph, "stance:s");
    const paths = wayInPaths(graph, sheet);
    expect(paths).toEqual({
      c1: { root: "1", path: "f1|f2|c1" },
      c2: { root: "1", path: "c2" },
      c3: { root: "S:1", path: "c3" },
    });
    for (const w of sheet.waysIn) {
      // The path spells the way in's input (tracePath joins inputs as the engine does).
      expect(tracePath(graph, { root: paths[w.cancel]!.root, path: paths[w.cancel]!.path })).toEqual({
        ok: true,
        input: w.input,
      });
    }
  });

  test("a loop of follow edges ends the walk instead of running forever", () => {
    const graph: MoveGraph = {
      nodes: [move("a", "a", "mid"), move("b", "a,b", "mid"), stance("stance:s")],
      edges: [
        follow("ab", "a", "b", ",b"),
        follow("ba", "b", "a", ",a"),
        cancel("c", "b", "stance:s", "~x", { onBlock: -2, onHit: 4 }),
      ],
    };
    expect(wayInPaths(graph, stanceSheet(graph, "stance:s")).c).toEqual({ root: "a", path: "ab|c" });
  });
});
