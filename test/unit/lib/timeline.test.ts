import { describe, expect, test } from "vitest";
import { explorePaths, type MoveGraph, type PathResult } from "@/lib/engine";
import { timelineSegments, timelineWidth, type GapSegment, type TimelineSegment } from "@/lib/timeline";

const move = (id: string, level: "high" | "mid" | "low", onBlock: number, startup?: number) => ({
  id,
  kind: "move" as const,
  input: id,
  level,
  damage: 10,
  ...(startup === undefined ? {} : { startup }),
  onBlock,
  onHit: 3,
  onCounterHit: 5,
});

// a ,2 b (gap 3) ,1 c (gap -1); c ~b into Lean (-4 on block), Lean 2 d (startup 12);
// c ~f into Coil with a state on block, so Coil's move has no gap known.
const graph: MoveGraph = {
  nodes: [
    move("a", "high", -3, 10),
    move("b", "mid", -6),
    move("c", "low", -14),
    move("d", "mid", -2, 12),
    move("e", "high", 1, 14),
    { id: "S", kind: "stance", name: "Lean" },
    { id: "K", kind: "stance", name: "Coil" },
  ],
  edges: [
    {
      id: "ab",
      kind: "follow",
      from: "a",
      to: "b",
      input: ",2",
      gapOnBlock: 3,
      comboOnHit: true,
      comboOnCounterHit: true,
    },
    {
      id: "bc",
      kind: "follow",
      from: "b",
      to: "c",
      input: ",1",
      gapOnBlock: -1,
      comboOnHit: true,
      comboOnCounterHit: true,
    },
    {
      id: "cS",
      kind: "cancel",
      from: "c",
      to: "S",
      input: "~b",
      onBlock: -4,
      onHit: 2,
      onCounterHit: 2,
      autoGuard: ["high"],
    },
    { id: "Sd", kind: "enter", from: "S", to: "d", input: "2" },
    {
      id: "cK",
      kind: "cancel",
      from: "c",
      to: "K",
      input: "~f",
      onBlock: { state: "knockdown" },
      onHit: { state: "knockdown" },
      onCounterHit: { state: "knockdown" },
      autoGuard: [],
    },
    { id: "Ke", kind: "enter", from: "K", to: "e", input: "1" },
  ],
};

function pathThrough(root: string, edges: string[]): PathResult {
  const path = explorePaths(graph, root).find((p) => p.edges.join("|") === edges.join("|"));
  if (path === undefined) throw new Error(`no path ${edges.join("|")} from ${root}`);
  return path;
}

const shape = (segs: TimelineSegment[]) =>
  segs.map((s) =>
    s.kind === "gap" ? `gap:${s.status}:${s.frames}` : s.kind === "hit" ? `hit:${s.label}:${s.level}` : s.kind,
  );
const gapsOf = (segs: TimelineSegment[]) => segs.filter((s): s is GapSegment => s.kind === "gap");

describe("timelineSegments", () => {
  test("draws a gap, a jail, a cancel and the stance move's gap at the cancel's advantage, in path order", () => {
    const path = pathThrough("a", ["ab", "bc", "cS", "Sd"]);
    const segs = timelineSegments(path, graph);
    expect(shape(segs)).toEqual([
      "hit:a:high",
      "gap:open:3",
      "hit:,2:mid",
      "gap:jail:-1",
      "hit:,1:low",
      "cancel",
      // startup 12 from the cancel's -4: 12 - (-4) - 1
      "gap:open:15",
      "hit:2:mid",
      "end",
    ]);
    // The open gaps are exactly the engine's, at the same hit indices.
    const open = gapsOf(segs).filter((g) => g.status === "open");
    expect(open.map((g) => ({ after: g.after, frames: g.frames }))).toEqual(path.gaps);
    expect(gapsOf(segs).map((g) => g.label)).toEqual(["3f gap", "jail", "15f gap"]);
    const cancel = segs.find((s) => s.kind === "cancel");
    expect(cancel).toMatchObject({ after: 2, final: false, framesSaved: null, stance: "Lean" });
    expect(segs.at(-1)).toMatchObject({ kind: "end", onBlock: -2, blockClass: "safe", lastHit: 3, cancelInput: null });
  });

  test("a path ending in the stance shows the engine's frames saved and the cancel's outcome at the end", () => {
    const path = pathThrough("a", ["ab", "bc", "cS"]);
    const segs = timelineSegments(path, graph);
    expect(shape(segs).slice(-2)).toEqual(["cancel", "end"]);
    expect(path.framesSaved).toBe(10);
    expect(segs.at(-2)).toMatchObject({ kind: "cancel", final: true, framesSaved: 10, onBlock: -4, hitOnBlock: -14 });
    expect(segs.at(-1)).toMatchObject({
      kind: "end",
      endsIn: "stance",
      onBlock: -4,
      blockClass: "safe",
      blockWord: "safe",
      cancelInput: "~b",
    });
  });

  test("a stance move after a cancel that ends in a state has no gap known", () => {
    const segs = timelineSegments(pathThrough("a", ["ab", "bc", "cK", "Ke"]), graph);
    expect(gapsOf(segs).at(-1)).toMatchObject({ after: 2, status: "unknown", frames: null, label: "? no gap known" });
  });

  test("a path from a stance root opens with the stance and puts no gap before its first hit", () => {
    const segs = timelineSegments(pathThrough("S", ["Sd"]), graph);
    expect(shape(segs)).toEqual(["start", "hit:2:mid", "end"]);
  });

  test("segments sit side by side without overlapping, and the width covers them all", () => {
    const segs = timelineSegments(pathThrough("a", ["ab", "bc", "cS", "Sd"]), graph);
    for (let i = 1; i < segs.length; i++) expect(segs[i]!.x).toBe(segs[i - 1]!.x + segs[i - 1]!.width);
    for (const s of segs) expect(s.width).toBeGreaterThan(0);
    const last = segs.at(-1)!;
    expect(timelineWidth(segs)).toBeGreaterThan(last.x + last.width);
  });
});
