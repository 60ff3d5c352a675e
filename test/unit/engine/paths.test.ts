import { describe, expect, test } from "vitest";
import {
  EngineInputError,
  explorePaths,
  explorePathsLimited,
  type MoveGraph,
  type PathResult,
} from "../../../src/lib/engine";
import { cancel, enter, follow, move, sampleGraph, stance } from "./fixtures";

function byEdges(paths: PathResult[]): Map<string, PathResult> {
  return new Map(paths.map((p) => [p.edges.join(" "), p]));
}

describe("explorePaths on the sample string", () => {
  const paths = explorePaths(sampleGraph(), "a");
  const at = byEdges(paths);
  const get = (key: string) => {
    const p = at.get(key);
    if (!p) throw new Error(`no path along "${key}"`);
    return p;
  };

  test("yields every stopping place once, in walk order", () => {
    expect(paths.map((p) => p.nodes.join(" "))).toEqual(["a", "a b", "a b c", "a b d", "a b s", "a b s e"]);
  });

  test("the root alone is a path", () => {
    expect(get("")).toEqual({
      nodes: ["a"],
      edges: [],
      input: "1",
      levels: ["high"],
      damage: 10,
      endsIn: "move",
      onBlock: 1,
      onHit: 8,
      onCounterHit: 8,
      framesSaved: null,
      blockClass: "plus",
      defenderStance: "standing",
      guards: [["stand", "duck"]],
      // A single hit has no step after the first: both hold vacuously.
      naturalCombo: true,
      jails: true,
      gaps: [],
      duckable: [0],
      mixupPoints: [],
      autoGuard: [],
    } satisfies PathResult);
  });

  test("a two-hit string that jails and combos", () => {
    const p = get("f1");
    expect(p.input).toBe("1,2");
    expect(p.levels).toEqual(["high", "mid"]);
    expect(p.damage).toBe(22);
    expect(p.onBlock).toBe(-14);
    expect(p.onCounterHit).toEqual({ state: "knockdown" });
    expect(p.blockClass).toBe("punishable");
    expect(p.naturalCombo).toBe(true);
    expect(p.jails).toBe(true);
    expect(p.gaps).toEqual([]);
    expect(p.guards).toEqual([["stand", "duck"], ["stand"]]);
    // b forks into a low and a high: the defender must guess there.
    expect(p.mixupPoints).toEqual(["b"]);
  });

  test("a low ending with a gap leaves the defender crouching", () => {
    const p = get("f1 f2");
    expect(p.input).toBe("1,2,4");
    expect(p.levels).toEqual(["high", "mid", "low"]);
    expect(p.damage).toBe(37);
    expect(p.defenderStance).toBe("crouching");
    expect(p.naturalCombo).toBe(false);
    expect(p.jails).toBe(false);
    expect(p.gaps).toEqual([{ after: 1, frames: 4 }]);
    expect(p.duckable).toEqual([0]);
    expect(p.guards[2]).toEqual(["crouch"]);
  });

  test("a high after a gap can be ducked", () => {
    const p = get("f1 f3");
    expect(p.gaps).toEqual([{ after: 1, frames: 2 }]);
    expect(p.duckable).toEqual([0, 2]);
    expect(p.naturalCombo).toBe(true);
    expect(p.jails).toBe(false);
    expect(p.blockClass).toBe("safe");
    expect(p.onCounterHit).toEqual({ state: "launch", frames: 40 });
  });

  test("ending in a stance takes the cancel's outcome", () => {
    const p = get("f1 c1");
    expect(p.endsIn).toBe("stance");
    expect(p.input).toBe("1,2~b");
    expect(p.levels).toEqual(["high", "mid"]);
    expect(p.damage).toBe(22);
    expect([p.onBlock, p.onHit, p.onCounterHit]).toEqual([-1, 4, 6]);
    expect(p.framesSaved).toBe(13);
    expect(p.blockClass).toBe("safe");
    expect(p.defenderStance).toBe("standing");
    expect(p.autoGuard).toEqual(["high"]);
    expect(p.naturalCombo).toBe(true);
    expect(p.jails).toBe(true);
  });

  test("a stance move after a cancel is a follow-up at the cancel's advantage", () => {
    const p = get("f1 c1 n1");
    expect(p.input).toBe("1,2~b2");
    expect(p.levels).toEqual(["high", "mid", "mid"]);
    expect(p.damage).toBe(42);
    expect(p.endsIn).toBe("move");
    expect(p.framesSaved).toBeNull();
    // startup 14 at -1: gap 14 - (-1) - 1 = 14; on hit +4 < 14, so no combo.
    expect(p.gaps).toEqual([{ after: 1, frames: 14 }]);
    expect(p.jails).toBe(false);
    expect(p.naturalCombo).toBe(false);
    expect(p.autoGuard).toEqual(["high"]);
    expect(p.onBlock).toBe(-6);
  });
});

describe("steps through a cancel", () => {
  function viaCancel(onBlock: number | { state: "knockdown" }, onHit: number | { state: "crumple" }, startup?: number) {
    const g: MoveGraph = {
      nodes: [move("m", "4", "mid"), stance("s"), move("x", "S 1", "high", startup === undefined ? {} : { startup })],
      edges: [cancel("c", "m", "s", "~f", { onBlock, onHit }), enter("n", "s", "x", "1")],
    };
    const p = explorePaths(g, "m").find((r) => r.nodes.join() === "m,s,x");
    if (!p) throw new Error("missing path");
    return p;
  }

  test("a fast stance move at plus frames jails and combos", () => {
    // startup 4 at +5: gap 4 - 5 - 1 = -2 (jails); 4 <= +6 on hit (combos).
    const p = viaCancel(5, 6, 4);
    expect(p.gaps).toEqual([]);
    expect(p.jails).toBe(true);
    expect(p.naturalCombo).toBe(true);
    expect(p.duckable).toEqual([]);
  });

  test("gap of exactly zero still jails, one frame does not", () => {
    expect(viaCancel(3, 0, 4).jails).toBe(true);
    const p = viaCancel(2, 0, 4);
    expect(p.jails).toBe(false);
    expect(p.gaps).toEqual([{ after: 0, frames: 1 }]);
    expect(p.duckable).toEqual([1]);
  });

  test("a state outcome on the cancel: no gap known and no combo", () => {
    const p = viaCancel({ state: "knockdown" }, { state: "crumple" }, 4);
    expect(p.gaps).toEqual([]);
    expect(p.jails).toBe(false);
    expect(p.naturalCombo).toBe(false);
    // Nothing is known to open before the high, so it is not reported as duckable.
    expect(p.duckable).toEqual([]);
  });

  test("a stance move without a startup has no known gap", () => {
    const p = viaCancel(5, 6);
    expect(p.gaps).toEqual([]);
    expect(p.jails).toBe(false);
    expect(p.naturalCombo).toBe(false);
  });

  test("framesSaved is null when either on-block outcome is a state", () => {
    const g: MoveGraph = {
      nodes: [move("m", "4", "mid", { onBlock: { state: "knockdown" } }), move("k", "6", "mid"), stance("s")],
      edges: [
        cancel("c1", "m", "s", "~f", { onBlock: -3, onHit: 2 }),
        cancel("c2", "k", "s", "~f", { onBlock: { state: "crumple" }, onHit: 2 }),
      ],
    };
    const fromM = explorePaths(g, "m");
    expect(fromM.map((p) => p.framesSaved)).toEqual([null, null]);
    expect(fromM[1]?.blockClass).toBe("safe");
    const fromK = explorePaths(g, "k");
    expect(fromK[1]?.framesSaved).toBeNull();
    expect(fromK[1]?.blockClass).toBe("state");
  });

  test("auto-guard levels are collected without repeats, in first-seen order", () => {
    const g: MoveGraph = {
      nodes: [move("m", "1", "mid"), stance("s"), move("x", "S 2", "mid", { startup: 12 }), stance("t")],
      edges: [
        cancel("c1", "m", "s", "~d", { onBlock: -2, onHit: 3 }, ["high", "mid"]),
        enter("n", "s", "x", "2"),
        cancel("c2", "x", "t", "~u", { onBlock: -2, onHit: 3 }, ["mid", "low", "low"]),
      ],
    };
    const paths = explorePaths(g, "m");
    expect(paths.map((p) => p.autoGuard)).toEqual([[], ["high", "mid"], ["high", "mid"], ["high", "mid", "low"]]);
  });
});

describe("bounds and cycles", () => {
  // Stance s loops back to itself through x: m ~ s 1 x ~ s 1 x ...
  const cyclic: MoveGraph = {
    nodes: [move("m", "3", "mid"), stance("s"), move("x", "S 1", "mid", { startup: 12 })],
    edges: [
      cancel("c1", "m", "s", "~b", { onBlock: -1, onHit: 3 }),
      enter("n", "s", "x", "1"),
      cancel("c2", "x", "s", "~b", { onBlock: -1, onHit: 3 }),
    ],
  };

  test("each stance is visited at most maxStanceVisits times", () => {
    expect(explorePaths(cyclic, "m").map((p) => p.edges.join(" "))).toEqual(["", "c1", "c1 n"]);
    expect(explorePaths(cyclic, "m", { maxStanceVisits: 2 }).map((p) => p.edges.join(" "))).toEqual([
      "",
      "c1",
      "c1 n",
      "c1 n c2",
      "c1 n c2 n",
    ]);
    expect(explorePaths(cyclic, "m", { maxStanceVisits: 0 }).map((p) => p.nodes)).toEqual([["m"]]);
  });

  test("maxDepth counts move nodes only", () => {
    const paths = explorePaths(cyclic, "m", { maxStanceVisits: 5, maxDepth: 2 });
    expect(paths.map((p) => p.nodes.join(" "))).toEqual(["m", "m s", "m s x", "m s x s"]);
    expect(Math.max(...paths.map((p) => p.levels.length))).toBe(2);
  });

  test("a repeated move is reported each time it is reached", () => {
    const g: MoveGraph = {
      nodes: [move("r", "2", "mid"), move("p", "2,1", "high"), move("q", "2,2", "low"), stance("s")],
      edges: [
        follow("f1", "r", "p", ",1"),
        follow("f2", "r", "q", ",2"),
        cancel("c", "r", "s", "~f", { onBlock: 0, onHit: 2 }),
        enter("n", "s", "r", "2"),
      ],
    };
    const p = explorePaths(g, "r", { maxStanceVisits: 1 }).find((x) => x.edges.join(" ") === "c n");
    expect(p?.nodes).toEqual(["r", "s", "r"]);
    expect(p?.mixupPoints).toEqual(["r", "r"]);
    expect(p?.damage).toBe(20);
  });
});

describe("mix-up points", () => {
  test("two follows whose hits take the same guards are no guess", () => {
    const g: MoveGraph = {
      nodes: [move("r", "1", "mid"), move("u", "1,1", "mid"), move("v", "1,2", "mid"), move("w", "1,3", "special-mid")],
      edges: [follow("f1", "r", "u", ",1"), follow("f2", "r", "v", ",2")],
    };
    expect(explorePaths(g, "r").map((p) => p.mixupPoints)).toEqual([[], [], []]);
    const withSpecial = { ...g, edges: [...g.edges, follow("f3", "r", "w", ",3")] };
    expect(explorePaths(withSpecial, "r").map((p) => p.mixupPoints)).toEqual([["r"], ["r"], ["r"], ["r"]]);
  });

  test("a cancel does not count as a follow for the guess", () => {
    const g: MoveGraph = {
      nodes: [move("r", "1", "mid"), move("u", "1,1", "low"), stance("s"), move("x", "S 1", "high", { startup: 12 })],
      edges: [
        follow("f1", "r", "u", ",1"),
        cancel("c", "r", "s", "~f", { onBlock: 0, onHit: 0 }),
        enter("n", "s", "x", "1"),
      ],
    };
    expect(explorePaths(g, "r").every((p) => p.mixupPoints.length === 0)).toBe(true);
  });
});

describe("a stance as root", () => {
  const g: MoveGraph = {
    nodes: [
      stance("s"),
      move("x", "S 1", "high", { startup: 12, damage: 7 }),
      move("y", "S 1,2", "mid", { damage: 9 }),
    ],
    edges: [enter("n", "s", "x", "S 1"), follow("f", "x", "y", ",2", { gapOnBlock: 3, comboOnHit: false })],
  };

  test("the stance alone has no outcome and is not a path; its moves are", () => {
    const paths = explorePaths(g, "s");
    expect(paths.map((p) => p.nodes)).toEqual([
      ["s", "x"],
      ["s", "x", "y"],
    ]);
    expect(paths[0]?.input).toBe("S 1");
    expect(paths[1]?.input).toBe("S 1,2");
    // The entered move opens the path: it is the first hit, so no combo or jail is broken by it.
    expect(paths[0]).toMatchObject({ naturalCombo: true, jails: true, duckable: [0], gaps: [], framesSaved: null });
    expect(paths[1]).toMatchObject({ naturalCombo: false, jails: false, gaps: [{ after: 0, frames: 3 }], damage: 16 });
  });

  test("the root stance counts as a visit", () => {
    expect(explorePaths(g, "s", { maxStanceVisits: 0 })).toEqual([]);
  });
});

describe("input checks", () => {
  test("an unknown root is named", () => {
    expect(() => explorePaths(sampleGraph(), "zz")).toThrow(/"zz"/);
  });

  test("a graph that skipped validation is still refused, naming the edge", () => {
    const g = sampleGraph();
    g.edges.push(follow("bad", "a", "s", ",9"));
    expect(() => explorePaths(g, "a")).toThrow(EngineInputError);
    expect(() => explorePaths(g, "a")).toThrow(/"bad"/);
  });

  test("options out of range are refused", () => {
    expect(() => explorePaths(sampleGraph(), "a", { maxDepth: 0 })).toThrow(/maxDepth/);
    expect(() => explorePaths(sampleGraph(), "a", { fastest: 12, launchAt: 11 })).toThrow(/launchAt/);
  });
});

describe("explorePathsLimited", () => {
  test("cuts at the limit and says so", () => {
    const cut = explorePathsLimited(sampleGraph(), "a", 4);
    expect(cut.paths.map((p) => p.nodes.join(" "))).toEqual(["a", "a b", "a b c", "a b d"]);
    expect(cut.truncated).toBe(true);
  });

  test("an exact fit is not truncated", () => {
    expect(explorePathsLimited(sampleGraph(), "a", 6).truncated).toBe(false);
    expect(explorePathsLimited(sampleGraph(), "a", 7).paths).toHaveLength(6);
  });
});
