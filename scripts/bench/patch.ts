import type { GraphEdge, GraphNode, MoveGraph, MoveNode, Outcome } from "../../src/lib/engine";
import { rng } from "./generate";

/**
 * The next Edition of a generated character, as a balance patch would make it: about a tenth
 * of the moves get new numbers (on block, on hit, damage, startup), a few follow-ups change
 * their gap or whether they combo, a cancel changes its advantage, two moves are added at the
 * end of strings and two leaves are taken out with their edges. Ids stay the keys.
 */
export function patchGraph(graph: MoveGraph, seed: number): MoveGraph {
  const rand = rng(seed);
  const int = (lo: number, hi: number) => lo + Math.floor(rand() * (hi - lo + 1));
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)]!;
  const nudge = (o: Outcome): Outcome => (typeof o === "number" ? o + pick([-4, -3, -2, 2, 3]) : o);

  const nodes: GraphNode[] = graph.nodes.map((node) => {
    if (node.kind !== "move" || rand() >= 0.1) return node;
    const changed: MoveNode = { ...node, onBlock: nudge(node.onBlock), onHit: nudge(node.onHit) };
    if (rand() < 0.5) changed.damage = node.damage + int(1, 4);
    if (node.startup !== undefined && rand() < 0.3) changed.startup = node.startup + 1;
    return changed;
  });

  const edges: GraphEdge[] = graph.edges.map((edge) => ({ ...edge }));
  const follows = edges.filter((e) => e.kind === "follow");
  for (let i = 0; i < 4; i++) {
    const f = pick(follows);
    f.gapOnBlock += pick([-3, 3]);
    f.comboOnHit = !f.comboOnHit;
  }
  const cancels = edges.filter((e) => e.kind === "cancel");
  for (let i = 0; i < 2 && cancels.length > 0; i++) {
    const c = pick(cancels);
    c.onBlock = nudge(c.onBlock);
  }

  // Two leaves (moves with no edge out) leave with the edges into them.
  const hasOut = new Set(edges.map((e) => e.from));
  const leaves = nodes.filter((n) => n.kind === "move" && !hasOut.has(n.id));
  const gone = new Set([pick(leaves).id, pick(leaves).id]);
  // Two new hits at the end of strings that stay.
  const ends = leaves.filter((n) => !gone.has(n.id));
  const added: GraphNode[] = [];
  for (let i = 0; i < 2; i++) {
    const from = pick(ends) as MoveNode;
    const id = `${from.id}-new${i}`;
    added.push({ ...from, id, input: `${from.input},${i + 1}`, onBlock: int(-16, 2), onHit: int(-2, 8) });
    edges.push({
      id: `${id}-in`,
      kind: "follow",
      from: from.id,
      to: id,
      input: `,${i + 1}`,
      gapOnBlock: int(-1, 4),
      comboOnHit: rand() < 0.5,
      comboOnCounterHit: true,
    });
  }
  return {
    nodes: [...nodes.filter((n) => !gone.has(n.id)), ...added],
    edges: edges.filter((e) => !gone.has(e.from) && !gone.has(e.to)),
  };
}
