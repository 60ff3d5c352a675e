import { EngineInputError, compileGraph } from "./compile";
import { DEFAULT_FASTEST, DEFAULT_LAUNCH_AT, canActFrom, guardsFor, hitsFirstInGap, punishersFor } from "./frames";
import type { PunisherMove } from "./frames";
import { MAX_DEPTH_LIMIT, MAX_STANCE_VISITS_LIMIT } from "./schema";
import type { BoardMove, CellBasis, FilledSituation, MoveGraph, MoveNode, PathResult } from "./types";
import { PathWalker } from "./walk";

/** One of the defender's neutral moves: what punishes, and what presses into a gap. */
export type OpponentMove = PunisherMove & { input: string };

export interface FillOptions {
  /** The defender's neutral moves (not from a stance of theirs). */
  opponent: readonly OpponentMove[];
  fastest?: number;
  launchAt?: number;
}

export const STAND_GUARD = "Stand guard";
export const CROUCH_GUARD = "Crouch guard";
export const STOP = "Stop";

/** The label of the column where the defender presses with `move`: "Press 1 (10f)". */
export function pressColumn(move: { input: string; startup: number }): string {
  return `Press ${move.input} (${move.startup}f)`;
}

/** Whether a column label is a press column's (`pressColumn`). */
export function isPressColumn(label: string): boolean {
  return label.startsWith("Press ");
}

/** One step on from the path: the extended path and, into a hit, the gap before it. */
interface Extension {
  path: PathResult;
  /** The new hit's node (null after a cancel, which ends in a stance). */
  hit: MoveNode | null;
  /** The gap on block before the new hit when one opens (a defender move may act there); else null. */
  gap: number | null;
}

type Column = { guard: "stand" | "crouch" } | { press: OpponentMove };

/**
 * The situation after the defender has blocked `path`, at the node it ends on, filled from the
 * engine (DESIGN.md, "Mix-up board"). The attacker's options (rows) are each follow and each
 * cancel out of the path's last move, or each move entered from the stance the path ends in,
 * and "Stop"; the defender's (columns) are "Stand guard", "Crouch guard" and, when some row
 * leaves a gap and the opponent has a move from their stance, pressing with their fastest.
 * Every figure comes from the engine's walk of the extended paths and the rules of frames.ts.
 */
export function fillSituation(graph: MoveGraph, path: PathResult, options: FillOptions): FilledSituation {
  const opponent = options.opponent;
  const { extensions, stanceName } = extend(graph, path, options);
  const punisher = (p: PathResult): BoardMove | null => {
    const best = punishersFor(p.onBlock, p.defenderStance, opponent)[0];
    return best === undefined ? null : boardMove(best);
  };
  const blocked = (p: PathResult): CellBasis => ({
    kind: "blocked",
    input: p.input,
    onBlock: p.onBlock,
    defenderStance: p.defenderStance,
    punisher: punisher(p),
  });

  const hits = extensions.filter((x) => x.hit !== null);
  const cancels = extensions.filter((x) => x.hit === null);
  const presser = fastestFrom(opponent, path.defenderStance);
  const columns: Column[] = [{ guard: "stand" }, { guard: "crouch" }];
  if (presser !== null && hits.some((x) => x.gap !== null)) columns.push({ press: presser });

  const hitCell = (x: Extension, col: Column): CellBasis => {
    const p = x.path;
    const level = p.levels[p.levels.length - 1]!;
    const damage = x.hit!.damage;
    if ("press" in col) {
      if (x.gap !== null && hitsFirstInGap(col.press.startup, x.gap)) {
        return { kind: "interrupted", input: p.input, gap: x.gap, interrupt: boardMove(col.press) };
      }
      return { kind: "hit", input: p.input, damage, outcome: p.onCounterHit, counterHit: true };
    }
    const guards = guardsFor(level);
    if (guards.includes(col.guard)) return blocked(p);
    if (col.guard === "crouch" && guards.includes("duck")) return { kind: "whiff", input: p.input };
    return { kind: "hit", input: p.input, damage, outcome: p.onHit, counterHit: false };
  };

  const rows: string[] = [];
  const cells: CellBasis[][] = [];
  for (const x of hits) {
    rows.push(x.path.input);
    cells.push(columns.map((col) => hitCell(x, col)));
  }
  // A cancel or a stop ends the string on this turn: whatever the defender does, they guard it.
  for (const x of [...cancels.map((c) => c.path), path]) {
    rows.push(x === path ? STOP : x.input);
    const cell = blocked(x);
    cells.push(columns.map(() => cell));
  }

  return {
    name: stanceName === null ? `After ${path.input} on block` : `In ${stanceName} after ${path.input}`,
    rows,
    cols: columns.map((c) => ("press" in c ? pressColumn(c.press) : c.guard === "stand" ? STAND_GUARD : CROUCH_GUARD)),
    cells,
  };
}

function boardMove(m: OpponentMove): BoardMove {
  return { input: m.input, damage: m.damage, startup: m.startup };
}

/** The opponent's fastest move from the defender's stance (among equally fast, the most damaging), or null. */
function fastestFrom(opponent: readonly OpponentMove[], stance: PathResult["defenderStance"]): OpponentMove | null {
  let best: OpponentMove | null = null;
  for (const m of opponent) {
    if (!canActFrom(m.from, stance)) continue;
    if (best === null || m.startup < best.startup || (m.startup === best.startup && m.damage > best.damage)) best = m;
  }
  return best;
}

/**
 * Every path one step longer than `path`, walked by the engine: the walk from the path's root
 * passes over every step off the path, so it visits the path's prefixes, the path and each
 * one-step extension, with every annotation computed as for any path.
 */
function extend(
  graph: MoveGraph,
  path: PathResult,
  { fastest = DEFAULT_FASTEST, launchAt = DEFAULT_LAUNCH_AT }: FillOptions,
): { extensions: Extension[]; stanceName: string | null } {
  const g = compileGraph(graph);
  const along = path.edges;
  const length = path.nodes.length;
  const visits = new Map<string, number>();
  for (const id of path.nodes) {
    const node = g.nodes[g.index.get(id) ?? -1];
    if (node?.kind === "stance") visits.set(id, (visits.get(id) ?? 0) + 1);
  }
  const walker = new PathWalker(g, path.nodes[0]!, {
    maxDepth: Math.min(MAX_DEPTH_LIMIT, Math.max(1, path.levels.length + 1)),
    maxStanceVisits: Math.min(MAX_STANCE_VISITS_LIMIT, Math.max(0, ...visits.values()) + 1),
    fastest,
    launchAt,
  });
  walker.passOver((d, edge) => (d < along.length ? g.edgeIds[edge] !== along[d] : d > along.length));

  let found = false;
  const extensions: Extension[] = [];
  while (walker.advance()) {
    if (walker.length === length) {
      found = path.nodes.every((id, i) => walker.nodeIdAt(i) === id);
    } else if (walker.length === length + 1) {
      const result = walker.toResult();
      const node = g.nodes[walker.nodeIndexAt(length)]!;
      const hit = node.kind === "move" ? node : null;
      const gap = hit === null ? undefined : result.gaps.find((x) => x.after === result.levels.length - 2);
      extensions.push({ path: result, hit, gap: gap?.frames ?? null });
    }
  }
  if (!found) throw new EngineInputError([`path "${path.input}" is not a path of this graph`]);
  const last = g.nodes[g.index.get(path.nodes[length - 1]!)!]!;
  return { extensions, stanceName: last.kind === "stance" ? last.name : null };
}
