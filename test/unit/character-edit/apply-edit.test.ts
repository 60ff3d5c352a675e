import { fc, test } from "@fast-check/vitest";
import { DirectedGraph } from "graphology";
import { describe, expect } from "vitest";
import { applyEdit, dependentsOf } from "@/lib/character-edit";
import { edgeKey, type PortableCharacter } from "@/lib/character-file";
import { characterArb } from "../character-file/arbitraries";
import { move } from "../character-io/fixtures";

/**
 * Moves that deleting `key` takes along, computed another way, with graphology (npm) as the
 * graph: drop the move, then walk the follows and enters from everything that still starts a
 * way in (a stance, or a move nothing led into); a move that had a way in and is no longer
 * reached goes. The same thing as `dependentsOf`' fixpoint when follows never loop, which the
 * validator ensures.
 */
function unreachableAfterDeleting(c: PortableCharacter, key: string): string[] {
  const g = new DirectedGraph();
  for (const s of c.stances) g.addNode(`stance:${s.key}`);
  for (const m of c.moves) g.addNode(m.key);
  for (const e of c.edges) {
    if (e.kind === "cancel") continue;
    const from = e.kind === "enter" ? `stance:${e.from}` : e.from;
    g.mergeEdge(from, e.to);
  }
  const hadWayIn = new Set(c.moves.filter((m) => g.inDegree(m.key) > 0).map((m) => m.key));
  g.dropNode(key);
  const seen = new Set<string>();
  const queue = g.filterNodes((n) => n.startsWith("stance:") || !hadWayIn.has(n));
  while (queue.length > 0) {
    const n = queue.pop()!;
    if (seen.has(n)) continue;
    seen.add(n);
    queue.push(...g.outNeighbors(n));
  }
  return c.moves.filter((m) => m.key !== key && hadWayIn.has(m.key) && !seen.has(m.key)).map((m) => m.key);
}

const withMove = characterArb().chain((c) =>
  fc.record({ c: fc.constant(c), key: fc.constantFrom(...c.moves.map((m) => m.key)) }),
);

describe("deleting a move", () => {
  test.prop([withMove], { numRuns: 200 })(
    "takes exactly the moves reached only through it, as a graph walk finds them",
    ({ c, key }) => {
      expect(dependentsOf(c, key).moves).toEqual(unreachableAfterDeleting(c, key));
    },
  );

  test.prop([withMove], { numRuns: 200 })(
    "leaves a character an import accepts, with no link to or from what went",
    ({ c, key }) => {
      const result = applyEdit(c, { op: "delete-move", key });
      expect(result.ok).toBe(true);
      if (!result.ok) return;
      const gone = new Set([key, ...dependentsOf(c, key).moves]);
      expect(result.character.moves.map((m) => m.key)).toEqual(
        c.moves.filter((m) => !gone.has(m.key)).map((m) => m.key),
      );
      expect(result.character.edges.every((e) => !gone.has(e.from) && !gone.has(e.to))).toBe(true);
      // Every link that touched none of them stays as it was.
      const kept = c.edges.filter((e) => !gone.has(e.from) && !gone.has(e.to)).map(edgeKey);
      expect(result.character.edges.map(edgeKey).sort()).toEqual(kept.sort());
    },
  );

  test("a follow-up with a second way in stays, and a move nothing leads into is a string of its own", () => {
    const c: PortableCharacter = {
      character: { slug: "t", name: "T", summary: null },
      stances: [],
      moves: ["1", "2", "1,1", "1,1,1"].map((key) => move(key)),
      edges: [follow("1", "1,1"), follow("2", "1,1,1"), follow("1,1", "1,1,1")],
    };
    expect(dependentsOf(c, "1")).toEqual({ moves: ["1,1"], edges: ["1>1,1", "1,1>1,1,1"] });
    expect(dependentsOf(c, "2")).toEqual({ moves: [], edges: ["2>1,1,1"] });
  });
});

describe("adding and changing", () => {
  const base: PortableCharacter = {
    character: { slug: "t", name: "T", summary: null },
    stances: [{ key: "crouch", name: "Low Coil", abbreviation: "LC", notes: null }],
    moves: [move("1"), move("1,1")],
    edges: [follow("1", "1,1")],
  };

  test("a follow-up is a new move and a follow from the chosen move", () => {
    const result = applyEdit(base, {
      op: "add-move",
      move: { ...move("1,1,2"), key: undefined },
      via: { kind: "follow", from: "1,1", input: ",2", gapOnBlock: 4, comboOnHit: true, comboOnCounterHit: true },
    });
    expect(result).toMatchObject({ ok: true, touched: { moves: ["1,1,2"], edges: ["1,1>1,1,2"] } });
  });

  test("a stance move is done from the stance", () => {
    const result = applyEdit(base, {
      op: "add-move",
      move: move("LC.3"),
      via: { kind: "enter", from: "crouch", input: "3" },
    });
    expect(result.ok && result.character.moves.at(-1)).toMatchObject({ key: "LC.3", stance: "crouch" });
  });

  test("a follow that would close a loop of hits is refused and names the loop", () => {
    const result = applyEdit(base, {
      op: "add-edge",
      edge: {
        kind: "follow",
        from: "1,1",
        to: "1",
        input: ",1",
        gapOnBlock: 0,
        comboOnHit: false,
        comboOnCounterHit: false,
      },
    });
    expect(result).toMatchObject({ ok: false, problems: [{ path: "edge", message: expect.stringContaining("loop") }] });
  });

  test("a bad value is reported at its field", () => {
    const result = applyEdit(base, { op: "change-edge", key: "1>1,1", changes: { gapOnBlock: 1.5 } });
    expect(result).toMatchObject({ ok: false, problems: [{ path: "changes.gapOnBlock" }] });
    const cancelField = applyEdit(base, { op: "change-edge", key: "1>1,1", changes: { onBlock: -3 } });
    expect(cancelField.ok).toBe(false);
  });

  test("a cancel goes into a stance the character has", () => {
    const edge = {
      kind: "cancel" as const,
      from: "1",
      to: "nowhere",
      input: "~f",
      onBlock: -2,
      onHit: 3,
      onCounterHit: 3,
      autoGuard: [],
    };
    expect(applyEdit(base, { op: "add-edge", edge })).toMatchObject({ ok: false, problems: [{ path: "edge.to" }] });
    expect(applyEdit(base, { op: "add-edge", edge: { ...edge, to: "crouch" } })).toMatchObject({
      ok: true,
      touched: { edges: ["1~f>crouch"] },
    });
  });
});

function follow(from: string, to: string) {
  return { kind: "follow" as const, from, to, input: ",1", gapOnBlock: 2, comboOnHit: true, comboOnCounterHit: true };
}
