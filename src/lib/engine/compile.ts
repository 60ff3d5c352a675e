import { GUARDS, outcomeFrames } from "./frames";
import { LEVELS, graphIssues } from "./schema";
import type { GraphEdge, GraphNode, Level, MoveGraph, Outcome } from "./types";

export interface StepOutcome {
  readonly onBlock: Outcome;
  readonly onHit: Outcome;
  readonly onCounterHit: Outcome;
}

function frozenOutcome(o: Outcome): Outcome {
  return typeof o === "number" ? o : Object.freeze({ ...o });
}

function frozenStep(o: StepOutcome): StepOutcome {
  return Object.freeze({
    onBlock: frozenOutcome(o.onBlock),
    onHit: frozenOutcome(o.onHit),
    onCounterHit: frozenOutcome(o.onCounterHit),
  });
}

export const FOLLOW = 0;
export const CANCEL = 1;
export const ENTER = 2;

export const LEVEL_CODE: Readonly<Record<Level, number>> = Object.freeze(
  Object.fromEntries(LEVELS.map((l, i) => [l, i])) as Record<Level, number>,
);

export class EngineInputError extends Error {
  readonly issues: string[];
  constructor(issues: string[]) {
    super(issues.join("; "));
    this.name = "EngineInputError";
    this.issues = issues;
  }
}

/**
 * The graph as flat typed arrays, built once per explore call, so the walk reads numbers
 * by index instead of chasing objects and string keys. Frame outcomes that are states are
 * stored as NaN: every comparison with NaN is false, which is exactly "no gap known" and
 * "does not combo".
 */
export class CompiledGraph {
  readonly source: MoveGraph;
  readonly index: ReadonlyMap<string, number>;
  readonly nodes: readonly GraphNode[];
  readonly edges: readonly GraphEdge[];
  readonly nodeCount: number;

  readonly isMove: Uint8Array;
  readonly level: Uint8Array;
  readonly damage: Float64Array;
  readonly startup: Float64Array;
  readonly blockFrames: Float64Array;
  /** Move nodes where the next hit's guards depend on which follow is taken. */
  readonly mixup: Uint8Array;

  /** Out-slots of node n are slotStart[n] .. slotStart[n + 1] - 1, in the graph's edge order. */
  readonly slotStart: Int32Array;
  readonly slotEdge: Int32Array;
  readonly slotTo: Int32Array;
  readonly slotKind: Uint8Array;

  /** Frozen copies of the outcomes of each move (by node) and each cancel (by edge), shared by every result. */
  readonly nodeOutcome: readonly (StepOutcome | undefined)[];
  readonly edgeOutcome: readonly (StepOutcome | undefined)[];
  readonly nodeIds: readonly string[];
  readonly edgeIds: readonly string[];
  readonly edgeInputs: readonly string[];

  readonly edgeGap: Float64Array;
  readonly edgeCombo: Uint8Array;
  readonly edgeBlockFrames: Float64Array;
  readonly edgeHitFrames: Float64Array;

  constructor(graph: MoveGraph) {
    const issues = graphIssues(graph);
    if (issues.length > 0) throw new EngineInputError(issues.map((i) => i.message));
    this.source = graph;
    this.nodes = graph.nodes;
    this.edges = graph.edges;
    const n = graph.nodes.length;
    const m = graph.edges.length;
    this.nodeCount = n;

    this.nodeOutcome = graph.nodes.map((node) => (node.kind === "move" ? frozenStep(node) : undefined));
    this.edgeOutcome = graph.edges.map((edge) => (edge.kind === "cancel" ? frozenStep(edge) : undefined));
    this.nodeIds = graph.nodes.map((node) => node.id);
    this.edgeIds = graph.edges.map((edge) => edge.id);
    this.edgeInputs = graph.edges.map((edge) => edge.input);

    const index = new Map<string, number>();
    graph.nodes.forEach((node, i) => index.set(node.id, i));
    this.index = index;

    this.isMove = new Uint8Array(n);
    this.level = new Uint8Array(n);
    this.damage = new Float64Array(n);
    this.startup = new Float64Array(n).fill(Number.NaN);
    this.blockFrames = new Float64Array(n).fill(Number.NaN);
    graph.nodes.forEach((node, i) => {
      if (node.kind !== "move") return;
      this.isMove[i] = 1;
      this.level[i] = LEVEL_CODE[node.level];
      this.damage[i] = node.damage;
      if (node.startup !== undefined) this.startup[i] = node.startup;
      this.blockFrames[i] = outcomeFrames(node.onBlock);
    });

    const from = new Int32Array(m);
    const to = new Int32Array(m);
    const outDegree = new Int32Array(n + 1);
    this.edgeGap = new Float64Array(m).fill(Number.NaN);
    this.edgeCombo = new Uint8Array(m);
    this.edgeBlockFrames = new Float64Array(m).fill(Number.NaN);
    this.edgeHitFrames = new Float64Array(m).fill(Number.NaN);
    graph.edges.forEach((edge, e) => {
      // graphIssues has already guaranteed both ends exist.
      from[e] = index.get(edge.from) as number;
      to[e] = index.get(edge.to) as number;
      outDegree[from[e] as number]! += 1;
      if (edge.kind === "follow") {
        this.edgeGap[e] = edge.gapOnBlock;
        this.edgeCombo[e] = edge.comboOnHit ? 1 : 0;
      } else if (edge.kind === "cancel") {
        this.edgeBlockFrames[e] = outcomeFrames(edge.onBlock);
        this.edgeHitFrames[e] = outcomeFrames(edge.onHit);
      }
    });

    this.slotStart = new Int32Array(n + 1);
    for (let i = 0; i < n; i++) this.slotStart[i + 1] = this.slotStart[i]! + outDegree[i]!;
    this.slotEdge = new Int32Array(m);
    this.slotTo = new Int32Array(m);
    this.slotKind = new Uint8Array(m);
    const fill = this.slotStart.slice(0, n);
    graph.edges.forEach((edge, e) => {
      const f = from[e]!;
      const s = fill[f]!;
      fill[f] = s + 1;
      this.slotEdge[s] = e;
      this.slotTo[s] = to[e]!;
      this.slotKind[s] = edge.kind === "follow" ? FOLLOW : edge.kind === "cancel" ? CANCEL : ENTER;
    });

    this.mixup = new Uint8Array(n);
    for (let i = 0; i < n; i++) {
      if (!this.isMove[i]) continue;
      let first: readonly string[] | undefined;
      for (let s = this.slotStart[i]!; s < this.slotStart[i + 1]!; s++) {
        if (this.slotKind[s] !== FOLLOW) continue;
        const next = graph.nodes[this.slotTo[s]!];
        if (next?.kind !== "move") continue;
        const guards = GUARDS[next.level];
        if (first === undefined) first = guards;
        else if (!sameGuards(first, guards)) {
          this.mixup[i] = 1;
          break;
        }
      }
    }
  }

  /** Node index of an id, or an error naming the id. */
  require(nodeId: string): number {
    const i = this.index.get(nodeId);
    if (i === undefined) throw new EngineInputError([`root "${nodeId}" is not a node of the graph`]);
    return i;
  }
}

function sameGuards(a: readonly string[], b: readonly string[]): boolean {
  if (a.length !== b.length) return false;
  for (const g of a) if (!b.includes(g)) return false;
  return true;
}

export function compileGraph(graph: MoveGraph | CompiledGraph): CompiledGraph {
  return graph instanceof CompiledGraph ? graph : new CompiledGraph(graph);
}
