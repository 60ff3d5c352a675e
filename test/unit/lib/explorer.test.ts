import { describe, expect, test } from "vitest";
import type { MoveGraph } from "@/lib/engine";
import { computePaths, parseExplorerSearch, pathKey, reachableSubgraph } from "@/lib/explorer";

const move = (id: string, onBlock = -5) => ({
  id,
  kind: "move" as const,
  input: id,
  level: "mid" as const,
  damage: 10,
  startup: 12,
  onBlock,
  onHit: 2,
  onCounterHit: 4,
});

// a → b, b ~> S, S → c, c ~> S (a stance loop); x is another string, not reachable from a.
const graph: MoveGraph = {
  nodes: [move("a"), move("b"), move("c"), move("x"), { id: "S", kind: "stance", name: "Lean" }],
  edges: [
    {
      id: "ab",
      kind: "follow",
      from: "a",
      to: "b",
      input: ",2",
      gapOnBlock: 0,
      comboOnHit: true,
      comboOnCounterHit: true,
    },
    {
      id: "bS",
      kind: "cancel",
      from: "b",
      to: "S",
      input: "~b",
      onBlock: -1,
      onHit: 3,
      onCounterHit: 3,
      autoGuard: [],
    },
    { id: "Sc", kind: "enter", from: "S", to: "c", input: ":1" },
    { id: "cS", kind: "cancel", from: "c", to: "S", input: "~b", onBlock: 0, onHit: 3, onCounterHit: 3, autoGuard: [] },
  ],
};

describe("reachableSubgraph", () => {
  test("keeps what the root reaches through follow-ups, cancels and stance moves, and nothing else", () => {
    const sub = reachableSubgraph(graph, "a");
    expect(sub.nodes.map((n) => n.id).sort()).toEqual(["S", "a", "b", "c"]);
    expect(sub.edges.map((e) => e.id)).toEqual(["ab", "bS", "Sc", "cS"]);
  });
});

describe("computePaths", () => {
  test("groups paths by the node they end at, shortest first", () => {
    const { byEnd, truncated } = computePaths(graph, "a", { maxStanceVisits: 2 });
    expect(truncated).toBe(false);
    const toStance = byEnd.get("S")!;
    expect(toStance.map((p) => p.input)).toEqual(["a,2~b", "a,2~b:1~b"]);
    expect(pathKey(toStance[0]!)).toBe("ab|bS");
  });

  test("finds every path by its key, and only that path", () => {
    const { paths, byKey } = computePaths(graph, "a", { maxStanceVisits: 2 });
    expect(byKey.size).toBe(paths.length);
    for (const p of paths) expect(byKey.get(pathKey(p))).toBe(p);
    expect(byKey.get("ab|nope")).toBeUndefined();
  });
});

describe("parseExplorerSearch", () => {
  test("reads what it knows and drops what does not fit instead of failing the page", () => {
    expect(parseExplorerSearch({ edition: "1-1", depth: "5", visits: "2", fastest: "12", path: "ab|bS" })).toEqual({
      edition: "1-1",
      depth: 5,
      visits: 2,
      fastest: 12,
      path: "ab|bS",
    });
    expect(parseExplorerSearch({ edition: "<script>", depth: "-3", fastest: "abc", visits: ["9", "1"] })).toEqual({
      edition: undefined,
      depth: undefined,
      visits: undefined,
      fastest: undefined,
      path: undefined,
    });
  });
});
