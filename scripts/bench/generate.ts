import type { GraphEdge, GraphNode, Level, MoveGraph } from "../../src/lib/engine";

/** Small seeded PRNG (mulberry32), so every run benches the same graphs. */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const LEVELS: Level[] = ["high", "mid", "low", "mid", "special-mid", "mid", "throw"];

/**
 * An invented character: a root string, then `stances` stances, each with a few stance
 * moves that continue into short branching strings, and cancels from hits into stances.
 * Follows and enters never close a cycle; cancels do. In a cyclic graph a cancel may lead
 * to any stance, so stances sit in cycles. With `acyclic`, the stances are split into
 * `layers` bands after the root string and a cancel only leads to a later band, so the
 * same kind of character comes without cycles and its paths span at most a few strings
 * (the peer cannot walk cycles; parallel edges are left out too, so that a sequence of
 * nodes names exactly one path).
 */
export function generateGraph(stances: number, seed: number, acyclic = false, layers = 3): MoveGraph {
  const rand = rng(seed);
  const nodes: GraphNode[] = [];
  const edges: GraphEdge[] = [];
  const band = new Map<string, number>();
  let currentBand = 0;
  const int = (lo: number, hi: number) => lo + Math.floor(rand() * (hi - lo + 1));
  const outcome = () => (rand() < 0.08 ? { state: "knockdown" as const } : int(-18, 6));
  let moveCount = 0;
  const addMove = (input: string, startup?: number) => {
    const id = `m${moveCount++}`;
    nodes.push({
      id,
      kind: "move",
      input,
      level: LEVELS[int(0, LEVELS.length - 1)]!,
      damage: int(5, 30),
      ...(startup === undefined ? {} : { startup }),
      onBlock: outcome(),
      onHit: outcome(),
      onCounterHit: outcome(),
    });
    band.set(id, currentBand);
    return id;
  };
  let edgeCount = 0;
  const addFollow = (from: string, to: string) =>
    edges.push({
      id: `e${edgeCount++}`,
      kind: "follow",
      from,
      to,
      input: `,${int(1, 4)}`,
      gapOnBlock: int(-2, 6),
      comboOnHit: rand() < 0.6,
      comboOnCounterHit: rand() < 0.8,
    });
  const hits: string[] = [];
  /** A short string from `first`: one or two branches of one or two more hits. */
  const string = (first: string) => {
    hits.push(first);
    const branches = int(1, 2);
    for (let b = 0; b < branches; b++) {
      let prev = first;
      const len = int(1, 2);
      for (let k = 0; k < len; k++) {
        const next = addMove("h");
        addFollow(prev, next);
        hits.push(next);
        prev = next;
      }
    }
  };
  string(addMove("1", 10));
  const stanceIds: string[] = [];
  const stanceMoves: string[][] = [];
  for (let s = 0; s < stances; s++) {
    const id = `s${s}`;
    nodes.push({ id, kind: "stance", name: `stance ${s}` });
    currentBand = 1 + Math.floor((s * layers) / stances);
    band.set(id, currentBand);
    stanceIds.push(id);
    const moves: string[] = [];
    // Without cycles a path crosses each band once, so the bands are made wider instead.
    for (let j = acyclic ? int(8, 12) : int(2, 3); j > 0; j--) {
      const m = addMove("S", int(8, 20));
      moves.push(m);
      string(m);
    }
    stanceMoves.push(moves);
  }
  stanceIds.forEach((s, k) => {
    for (const m of stanceMoves[k]!)
      edges.push({ id: `e${edgeCount++}`, kind: "enter", from: s, to: m, input: `${int(1, 4)}` });
  });
  const seen = new Set<string>();
  for (const h of hits) {
    if (stances === 0 || rand() < 0.15) continue;
    const cancels = acyclic ? int(3, 7) : int(1, 3);
    for (let c = 0; c < cancels; c++) {
      let to = stanceIds[int(0, stances - 1)]!;
      if (acyclic) {
        const later = stanceIds.filter((s) => band.get(s)! > band.get(h)!);
        if (later.length === 0) break;
        to = later[int(0, later.length - 1)]!;
        if (seen.has(`${h}>${to}`)) continue;
        seen.add(`${h}>${to}`);
      }
      edges.push({
        id: `e${edgeCount++}`,
        kind: "cancel",
        from: h,
        to,
        input: "~b",
        onBlock: outcome(),
        onHit: outcome(),
        onCounterHit: outcome(),
        autoGuard: rand() < 0.3 ? ["high"] : [],
      });
    }
  }
  return { nodes, edges };
}
