import { fc } from "@fast-check/vitest";
import type {
  ExploreOptions,
  GraphEdge,
  GraphNode,
  Level,
  MoveGraph,
  MoveNode,
  Outcome,
  PathResult,
} from "../../../src/lib/engine";

const levels: Level[] = ["high", "mid", "low", "special-mid", "throw", "unblockable"];

const outcomeArb: fc.Arbitrary<Outcome> = fc.oneof(
  { weight: 4, arbitrary: fc.integer({ min: -20, max: 12 }) },
  {
    weight: 1,
    arbitrary: fc.record(
      {
        state: fc.constantFrom("knockdown", "launch", "wall-splat", "crumple", "throw" as const),
        frames: fc.integer({ min: -5, max: 60 }),
      },
      { requiredKeys: ["state"] },
    ),
  },
);

const moveArb = (i: number): fc.Arbitrary<MoveNode> =>
  fc
    .record({
      level: fc.constantFrom(...levels),
      damage: fc.integer({ min: 0, max: 40 }),
      startup: fc.option(fc.integer({ min: 1, max: 24 }), { nil: undefined }),
      onBlock: outcomeArb,
      onHit: outcomeArb,
      onCounterHit: outcomeArb,
    })
    .map(({ startup, ...rest }) => ({
      id: `m${i}`,
      kind: "move" as const,
      input: `${i}`,
      ...(startup === undefined ? {} : { startup }),
      ...rest,
    }));

export interface GraphShape {
  moves: number;
  stances: number;
  /** When true, every edge goes from a lower node rank to a higher one, so the graph has no cycle. */
  acyclic: boolean;
}

/**
 * Random invented move graphs. Cyclic graphs loop through stances and strings; acyclic
 * ones rank every node (moves and stances interleaved) and only point forward.
 */
export function graphArb({ moves, stances, acyclic }: GraphShape): fc.Arbitrary<MoveGraph> {
  return fc
    .record({
      m: fc.integer({ min: 1, max: moves }),
      s: fc.integer({ min: 0, max: stances }),
    })
    .chain(({ m, s }) => {
      const moveIds = Array.from({ length: m }, (_, i) => `m${i}`);
      const stanceIds = Array.from({ length: s }, (_, i) => `s${i}`);
      // Rank for the acyclic case: stance j sits after move j.
      const rank = new Map<string, number>();
      moveIds.forEach((id, i) => rank.set(id, 2 * i));
      stanceIds.forEach((id, j) => rank.set(id, 2 * j + 1));
      const pick = (ids: string[]) => fc.constantFrom(...ids);
      const followArb = fc.record({
        from: pick(moveIds),
        to: pick(moveIds),
        gapOnBlock: fc.integer({ min: -4, max: 8 }),
        comboOnHit: fc.boolean(),
        comboOnCounterHit: fc.boolean(),
        input: fc.constantFrom(",1", ",2", ",3", ",4", "+1", ""),
      });
      const cancelArb =
        s === 0
          ? fc.constant(null)
          : fc.record({
              from: pick(moveIds),
              to: pick(stanceIds),
              onBlock: outcomeArb,
              onHit: outcomeArb,
              onCounterHit: outcomeArb,
              autoGuard: fc.subarray(levels, { maxLength: 3 }),
              input: fc.constantFrom("~b", "~f", "~d"),
            });
      const enterArb =
        s === 0
          ? fc.constant(null)
          : fc.record({ from: pick(stanceIds), to: pick(moveIds), input: fc.constantFrom("1", "2", "3+4") });
      return fc
        .record({
          nodes: fc.tuple(...moveIds.map((_, i) => moveArb(i))),
          follows: fc.array(followArb, { minLength: m - 1, maxLength: 3 * m }),
          cancels: fc.array(cancelArb, { minLength: s === 0 ? 0 : 1, maxLength: s === 0 ? 0 : 2 * m }),
          enters: fc.array(enterArb, { minLength: s, maxLength: s === 0 ? 0 : 3 * s }),
        })
        .map(({ nodes, follows, cancels, enters }) => {
          const forward = (e: { from: string; to: string }) => !acyclic || rank.get(e.from)! < rank.get(e.to)!;
          const edges: GraphEdge[] = [];
          let k = 0;
          for (const f of follows) if (forward(f)) edges.push({ id: `f${k++}`, kind: "follow", ...f });
          for (const c of cancels) if (c && forward(c)) edges.push({ id: `c${k++}`, kind: "cancel", ...c });
          for (const n of enters) if (n && forward(n)) edges.push({ id: `n${k++}`, kind: "enter", ...n });
          const allNodes: GraphNode[] = [
            ...nodes,
            ...stanceIds.map((id) => ({ id, kind: "stance" as const, name: id })),
          ];
          return { nodes: allNodes, edges };
        });
    });
}

export const optionsArb: fc.Arbitrary<Required<ExploreOptions>> = fc.record({
  maxDepth: fc.integer({ min: 1, max: 5 }),
  maxStanceVisits: fc.integer({ min: 0, max: 2 }),
  fastest: fc.integer({ min: 7, max: 12 }),
  launchAt: fc.integer({ min: 12, max: 18 }),
});

/**
 * A straightforward re-statement of DESIGN.md's path semantics: plain recursion over the
 * graph's objects, and every field recomputed from the whole path. Slow on purpose; it
 * shares no code with the engine.
 */
export function oraclePaths(graph: MoveGraph, rootId: string, options: Required<ExploreOptions>): PathResult[] {
  const byId = new Map(graph.nodes.map((n) => [n.id, n]));
  const out: PathResult[] = [];
  const root = byId.get(rootId)!;
  const rec = (nodes: GraphNode[], edges: GraphEdge[]) => {
    if (nodes.some((n) => n.kind === "move")) out.push(annotate(graph, nodes, edges, options));
    const last = nodes[nodes.length - 1]!;
    for (const e of graph.edges) {
      if (e.from !== last.id) continue;
      const t = byId.get(e.to)!;
      if (t.kind === "move" && nodes.filter((n) => n.kind === "move").length >= options.maxDepth) continue;
      if (t.kind === "stance" && nodes.filter((n) => n.id === t.id).length >= options.maxStanceVisits) continue;
      rec([...nodes, t], [...edges, e]);
    }
  };
  if (root.kind === "move" || options.maxStanceVisits >= 1) rec([root], []);
  return out;
}

const guardsOf: Record<Level, PathResult["guards"][number]> = {
  high: ["stand", "duck"],
  mid: ["stand"],
  low: ["crouch"],
  "special-mid": ["stand", "crouch"],
  throw: ["break"],
  unblockable: ["evade"],
};

function annotate(
  graph: MoveGraph,
  nodes: GraphNode[],
  edges: GraphEdge[],
  { fastest, launchAt }: Required<ExploreOptions>,
): PathResult {
  const hits: { node: MoveNode; gap: number | undefined; combo: boolean }[] = [];
  nodes.forEach((node, i) => {
    if (node.kind !== "move") return;
    const step = i === 0 ? undefined : edges[i - 1]!;
    let gap: number | undefined;
    let combo = false;
    if (step?.kind === "follow") {
      gap = step.gapOnBlock;
      combo = step.comboOnHit;
    } else if (step?.kind === "enter") {
      const before = i >= 2 ? edges[i - 2] : undefined;
      if (before?.kind === "cancel" && node.startup !== undefined) {
        if (typeof before.onBlock === "number") gap = node.startup - before.onBlock - 1;
        combo = typeof before.onHit === "number" && node.startup <= before.onHit;
      }
    }
    hits.push({ node, gap, combo });
  });
  const later = hits.slice(1);
  const last = nodes[nodes.length - 1]!;
  const lastEdge = edges[edges.length - 1];
  const outcome = last.kind === "move" ? last : (lastEdge as Extract<GraphEdge, { kind: "cancel" }>);
  const a = outcome.onBlock;
  let framesSaved: number | null = null;
  if (last.kind === "stance") {
    const before = nodes[nodes.length - 2] as MoveNode;
    if (typeof a === "number" && typeof before.onBlock === "number") framesSaved = a - before.onBlock;
  }
  const blockClass =
    typeof a !== "number"
      ? "state"
      : a > 0
        ? "plus"
        : a === 0
          ? "even"
          : -a < fastest
            ? "safe"
            : -a < launchAt
              ? "punishable"
              : "launch-punishable";
  const mixupPoints = nodes
    .filter((n): n is MoveNode => n.kind === "move")
    .filter((n) => {
      const sets = new Set(
        graph.edges
          .filter((e) => e.kind === "follow" && e.from === n.id)
          .map((e) => {
            const t = graph.nodes.find((x) => x.id === e.to) as MoveNode;
            return [...guardsOf[t.level]].sort().join("+");
          }),
      );
      return sets.size >= 2;
    })
    .map((n) => n.id);
  const autoGuard: Level[] = [];
  for (const e of edges) {
    if (e.kind !== "cancel") continue;
    for (const l of e.autoGuard) if (!autoGuard.includes(l)) autoGuard.push(l);
  }
  return {
    nodes: nodes.map((n) => n.id),
    edges: edges.map((e) => e.id),
    input: (root(nodes).kind === "move" ? (root(nodes) as MoveNode).input : "") + edges.map((e) => e.input).join(""),
    levels: hits.map((h) => h.node.level),
    damage: hits.reduce((s, h) => s + h.node.damage, 0),
    endsIn: last.kind,
    onBlock: outcome.onBlock,
    onHit: outcome.onHit,
    onCounterHit: outcome.onCounterHit,
    framesSaved,
    blockClass,
    defenderStance: hits[hits.length - 1]!.node.level === "low" ? "crouching" : "standing",
    guards: hits.map((h) => [...guardsOf[h.node.level]]),
    naturalCombo: later.every((h) => h.combo),
    jails: later.every((h) => h.gap !== undefined && h.gap <= 0),
    gaps: hits.flatMap((h, i) => (i > 0 && h.gap !== undefined && h.gap > 0 ? [{ after: i - 1, frames: h.gap }] : [])),
    duckable: hits.flatMap((h, i) =>
      h.node.level === "high" && (i === 0 || (h.gap !== undefined && h.gap >= 1)) ? [i] : [],
    ),
    mixupPoints,
    autoGuard,
  };
}

function root(nodes: GraphNode[]): GraphNode {
  return nodes[0]!;
}
