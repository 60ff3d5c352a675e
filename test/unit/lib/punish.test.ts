import { describe, expect, test } from "vitest";
import { explorePaths, type MoveGraph } from "@/lib/engine";
import type { Starter } from "@/lib/explorer";
import { followUpsAt, punishesFor, withBestCombos } from "@/lib/punish";

const move = (
  id: string,
  level: "high" | "mid" | "low",
  damage: number,
  onBlock: number,
  onHit: number,
  startup?: number,
) => ({
  id,
  kind: "move" as const,
  input: id,
  level,
  damage,
  ...(startup === undefined ? {} : { startup }),
  onBlock,
  onHit,
  onCounterHit: onHit + 2,
});

// An invented cast of moves: a 10-frame jab string, a 12-frame mid, a 15-frame rising launcher (crouching only).
const graph: MoveGraph = {
  nodes: [
    move("j", "high", 7, 1, 8, 10),
    move("j,2", "high", 9, -3, 5),
    move("m", "mid", 14, -6, 4, 12),
    move("u", "mid", 20, -14, 3, 15),
    move("lo", "low", 12, -13, 3, 16),
  ],
  edges: [
    {
      id: "jj",
      kind: "follow",
      from: "j",
      to: "j,2",
      input: ",2",
      gapOnBlock: 0,
      comboOnHit: true,
      comboOnCounterHit: true,
    },
  ],
};
const starters: Starter[] = [
  { id: "j", input: "j", name: "Jab", startup: 10, damage: 7, from: "standing", stance: null },
  { id: "m", input: "m", name: "Mid", startup: 12, damage: 14, from: "standing", stance: null },
  { id: "u", input: "u", name: "Rise", startup: 15, damage: 20, from: "crouching", stance: null },
];
const path = (root: string) => explorePaths(graph, root).find((p) => p.nodes.length === 1)!;

describe("withBestCombos", () => {
  test("a starter's damage is its most damaging natural combo", () => {
    const jab = withBestCombos(graph, starters).find((o) => o.id === "j");
    expect(jab).toMatchObject({ damage: 16, comboInput: "j,2" });
  });
});

describe("punishesFor", () => {
  const options = withBestCombos(graph, starters);

  test("-14 on block against a standing defender: the 10- and 12-frame moves, best damage first (common practice, no source)", () => {
    expect(punishesFor(path("u"), options).map((o) => o.id)).toEqual(["j", "m"]);
  });

  test("after a low the defender is crouching, so only what comes out of a crouch punishes (common practice, no source)", () => {
    // -13 after the low: the crouching-only riser needs 15 frames, too slow; the standing moves do not apply.
    expect(punishesFor(path("lo"), options)).toEqual([]);
    const faster = withBestCombos(graph, [{ ...starters[2]!, startup: 13 }]);
    expect(punishesFor(path("lo"), faster).map((o) => o.id)).toEqual(["u"]);
  });

  test("a safe ending has no punisher", () => {
    expect(punishesFor(path("m"), options)).toEqual([]);
  });
});

describe("followUpsAt", () => {
  test("at +8 on hit a 10-frame move is a frame trap and nothing is guaranteed; at +12 the 10- and 12-frame moves are guaranteed", () => {
    const own = withBestCombos(graph, starters);
    const jab = path("j");
    expect(followUpsAt(jab, 8, own, 10).map((o) => [o.id, o.kind])).toEqual([
      ["u", "frame-trap"],
      ["j", "frame-trap"],
      ["m", "frame-trap"],
    ]);
    expect(followUpsAt(jab, 12, own, 10).map((o) => [o.id, o.kind])).toEqual([
      ["j", "guaranteed"],
      ["m", "guaranteed"],
      ["u", "frame-trap"],
    ]);
    expect(followUpsAt(jab, { state: "knockdown" }, own, 10)).toEqual([]);
  });
});
