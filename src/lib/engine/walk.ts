import * as compiled from "./compile";
import { CompiledGraph, EngineInputError, compileGraph, type StepOutcome } from "./compile";
import * as frames from "./frames";
import * as schema from "./schema";
import type {
  BlockClass,
  DefenderStance,
  ExploreOptions,
  Gap,
  Guard,
  Level,
  MoveGraph,
  Outcome,
  PathResult,
  PathView,
  ResolvedOptions,
} from "./types";

// Module-local copies of imported bindings: a transpiler that turns imports into live
// getters (tsx, vitest) would otherwise make every use in the hot loop a function call.
const CANCEL = compiled.CANCEL;
const FOLLOW = compiled.FOLLOW;
const HIGH = compiled.HIGH;
const LOW = compiled.LOW;
const LEVELS = schema.LEVELS;
const optionsSchema = schema.optionsSchema;
const classifyFrames = frames.classifyFrames;
const GUARDS = frames.GUARDS;

export function resolveOptions(options?: ExploreOptions): ResolvedOptions {
  const parsed = optionsSchema.safeParse(options ?? {});
  if (!parsed.success) {
    throw new EngineInputError(
      parsed.error.issues.map((i) => `option ${i.path.join(".") || "(root)"}: ${i.message}`),
    );
  }
  return parsed.data;
}

/**
 * A depth-first walk over every place a path may stop, one place per `advance()`.
 *
 * The walker is itself the cursor: after `advance()` returns true its fields describe the
 * current path. All running annotations live on explicit per-depth stacks, so going one
 * step deeper writes one slot and going back is free: a depth's list lengths and flags
 * are read from its own slot, and whatever lies beyond them is simply overwritten later.
 * Array-valued fields are built only when read; `toResult()` builds a detached copy.
 */
export class PathWalker implements PathView {
  private readonly g: CompiledGraph;
  private readonly root: number;
  private readonly maxDepth: number;
  private readonly maxStanceVisits: number;
  private readonly fastest: number;
  private readonly launchAt: number;

  /** Index of the path's last node on the stacks; -1 before the first or after the last path. */
  private d = -1;
  private started = false;

  // Per depth.
  private readonly sNode: Int32Array;
  private readonly sEdge: Int32Array;
  private readonly sNext: Int32Array;
  private readonly sMoves: Int32Array;
  private readonly sDamage: Float64Array;
  private readonly sCombo: Uint8Array;
  private readonly sJail: Uint8Array;
  private readonly sGapLen: Int32Array;
  private readonly sDuckLen: Int32Array;
  private readonly sMixLen: Int32Array;
  private readonly sAgLen: Int32Array;
  private readonly sAgMask: Int32Array;

  // Lists whose current length is kept per depth above.
  private readonly hitNode: Int32Array;
  private readonly gapAfter: Int32Array;
  private readonly gapFrames: Float64Array;
  private readonly duckIdx: Int32Array;
  private readonly mixNode: Int32Array;
  private readonly agOrder: Uint8Array;

  private readonly visits: Int32Array;

  // The input of each depth's path, kept once built: a child's input is its parent's plus
  // one edge, so materialising in walk order costs one string per path. A depth's cache is
  // valid while its stamp equals the push that put the current node there.
  private pushes = 0;
  private readonly sStamp: Float64Array;
  private readonly inputStamp: Float64Array;
  private readonly inputAt: string[];

  constructor(graph: MoveGraph | CompiledGraph, rootId: string, options?: ExploreOptions) {
    const g = compileGraph(graph);
    const o = resolveOptions(options);
    this.g = g;
    this.root = g.require(rootId);
    this.maxDepth = o.maxDepth;
    this.maxStanceVisits = o.maxStanceVisits;
    this.fastest = o.fastest;
    this.launchAt = o.launchAt;
    // At most maxDepth moves, each stance is preceded by a move except a stance root.
    const size = 2 * o.maxDepth + 2;
    this.sNode = new Int32Array(size);
    this.sEdge = new Int32Array(size);
    this.sNext = new Int32Array(size);
    this.sMoves = new Int32Array(size);
    this.sDamage = new Float64Array(size);
    this.sCombo = new Uint8Array(size);
    this.sJail = new Uint8Array(size);
    this.sGapLen = new Int32Array(size);
    this.sDuckLen = new Int32Array(size);
    this.sMixLen = new Int32Array(size);
    this.sAgLen = new Int32Array(size);
    this.sAgMask = new Int32Array(size);
    this.hitNode = new Int32Array(o.maxDepth);
    this.gapAfter = new Int32Array(o.maxDepth);
    this.gapFrames = new Float64Array(o.maxDepth);
    this.duckIdx = new Int32Array(o.maxDepth);
    this.mixNode = new Int32Array(o.maxDepth);
    this.agOrder = new Uint8Array(LEVELS.length);
    this.visits = new Int32Array(g.nodeCount);
    this.sStamp = new Float64Array(size);
    this.inputStamp = new Float64Array(size).fill(-1);
    this.inputAt = new Array<string>(size).fill("");
  }

  /** Starts the walk over, so one walker can serve several passes. */
  reset(): this {
    this.d = -1;
    this.started = false;
    this.visits.fill(0);
    return this;
  }

  /** Moves to the next path; false when every path has been visited. */
  advance(): boolean {
    if (this.d < 0) {
      if (this.started) return false;
      this.started = true;
      return this.pushRoot();
    }
    return this.descend();
  }

  private pushRoot(): boolean {
    const g = this.g;
    const r = this.root;
    this.sNode[0] = r;
    this.sEdge[0] = -1;
    this.sNext[0] = g.slotStart[r]!;
    this.sCombo[0] = 1;
    this.sJail[0] = 1;
    this.sGapLen[0] = 0;
    this.sMixLen[0] = 0;
    this.sAgLen[0] = 0;
    this.sAgMask[0] = 0;
    this.sStamp[0] = ++this.pushes;
    this.d = 0;
    if (g.isMove[r]) {
      this.sMoves[0] = 1;
      this.hitNode[0] = r;
      this.sDamage[0] = g.damage[r]!;
      this.sDuckLen[0] = g.level[r] === HIGH ? 1 : 0;
      this.duckIdx[0] = 0;
      if (g.mixup[r]) this.mixNode[this.sMixLen[0]++] = r;
      return true;
    }
    // A stance root alone has no hit and so no outcome: it is not a path, only a start.
    if (this.maxStanceVisits < 1) {
      this.d = -1;
      return false;
    }
    this.visits[r] = 1;
    this.sMoves[0] = 0;
    this.sDamage[0] = 0;
    this.sDuckLen[0] = 0;
    return this.descend();
  }

  private descend(): boolean {
    const g = this.g;
    const slotStart = g.slotStart;
    const slotKind = g.slotKind;
    const slotTo = g.slotTo;
    const sNode = this.sNode;
    const sNext = this.sNext;
    const sMoves = this.sMoves;
    const visits = this.visits;
    const maxDepth = this.maxDepth;
    const maxVisits = this.maxStanceVisits;
    let d = this.d;
    while (d >= 0) {
      const n = sNode[d]!;
      const end = slotStart[n + 1]!;
      let slot = sNext[d]!;
      while (slot < end) {
        const kind = slotKind[slot]!;
        const to = slotTo[slot]!;
        if (kind === CANCEL) {
          if (visits[to]! < maxVisits) {
            sNext[d] = slot + 1;
            this.pushStance(d, slot, to);
            return true;
          }
        } else if (sMoves[d]! < maxDepth) {
          sNext[d] = slot + 1;
          this.pushMove(d, slot, to, kind);
          return true;
        }
        slot++;
      }
      if (!g.isMove[n]) visits[n]!--;
      d--;
    }
    this.d = -1;
    return false;
  }

  private pushMove(d: number, slot: number, t: number, kind: number): void {
    const g = this.g;
    const e = g.slotEdge[slot]!;
    const nd = d + 1;
    this.d = nd;
    this.sStamp[nd] = ++this.pushes;
    this.sNode[nd] = t;
    this.sEdge[nd] = e;
    this.sNext[nd] = g.slotStart[t]!;
    const hit = this.sMoves[d]!;
    this.sMoves[nd] = hit + 1;
    this.hitNode[hit] = t;
    this.sDamage[nd] = this.sDamage[d]! + g.damage[t]!;

    // NaN marks "no gap known": it fails every comparison below.
    let gap: number;
    let combo: number;
    if (kind === FOLLOW) {
      gap = g.edgeGap[e]!;
      combo = g.edgeCombo[e]!;
    } else {
      const cancel = this.sEdge[d]!;
      if (cancel >= 0) {
        const s = g.startup[t]!;
        gap = s - g.edgeBlockFrames[cancel]! - 1;
        combo = s <= g.edgeHitFrames[cancel]! ? 1 : 0;
      } else {
        gap = Number.NaN;
        combo = 0;
      }
    }

    let gapLen = this.sGapLen[d]!;
    let duckLen = this.sDuckLen[d]!;
    if (hit === 0) {
      // The path's first hit (from a stance root) opens the path: nothing before it to combo or jail.
      this.sCombo[nd] = 1;
      this.sJail[nd] = 1;
      if (g.level[t] === HIGH) this.duckIdx[duckLen++] = 0;
    } else {
      this.sCombo[nd] = this.sCombo[d]! & combo;
      this.sJail[nd] = this.sJail[d]! & (gap <= 0 ? 1 : 0);
      if (gap > 0) {
        this.gapAfter[gapLen] = hit - 1;
        this.gapFrames[gapLen] = gap;
        gapLen++;
        if (g.level[t] === HIGH) this.duckIdx[duckLen++] = hit;
      }
    }
    this.sGapLen[nd] = gapLen;
    this.sDuckLen[nd] = duckLen;
    let mixLen = this.sMixLen[d]!;
    if (g.mixup[t]) this.mixNode[mixLen++] = t;
    this.sMixLen[nd] = mixLen;
    this.sAgLen[nd] = this.sAgLen[d]!;
    this.sAgMask[nd] = this.sAgMask[d]!;
  }

  private pushStance(d: number, slot: number, t: number): void {
    const g = this.g;
    const e = g.slotEdge[slot]!;
    const nd = d + 1;
    this.d = nd;
    this.sStamp[nd] = ++this.pushes;
    this.visits[t]!++;
    this.sNode[nd] = t;
    this.sEdge[nd] = e;
    this.sNext[nd] = g.slotStart[t]!;
    this.sMoves[nd] = this.sMoves[d]!;
    this.sDamage[nd] = this.sDamage[d]!;
    this.sCombo[nd] = this.sCombo[d]!;
    this.sJail[nd] = this.sJail[d]!;
    this.sGapLen[nd] = this.sGapLen[d]!;
    this.sDuckLen[nd] = this.sDuckLen[d]!;
    this.sMixLen[nd] = this.sMixLen[d]!;
    let mask = this.sAgMask[d]!;
    let len = this.sAgLen[d]!;
    const end = g.agStart[e + 1]!;
    for (let k = g.agStart[e]!; k < end; k++) {
      const level = g.agLevels[k]!;
      const bit = 1 << level;
      if ((mask & bit) === 0) {
        mask |= bit;
        this.agOrder[len++] = level;
      }
    }
    this.sAgMask[nd] = mask;
    this.sAgLen[nd] = len;
  }

  // ---- The current path. Scalars are O(1); arrays are built on read. ----

  /** Number of nodes on the current path. */
  get length(): number {
    return this.d + 1;
  }

  /** Number of hits (move nodes) on the current path. */
  get hitCount(): number {
    return this.sMoves[this.d]!;
  }

  get damage(): number {
    return this.sDamage[this.d]!;
  }

  get endsIn(): "move" | "stance" {
    return this.g.isMove[this.sNode[this.d]!] ? "move" : "stance";
  }

  private lastStep(): StepOutcome {
    const n = this.sNode[this.d]!;
    return (this.g.isMove[n] ? this.g.nodeOutcome[n] : this.g.edgeOutcome[this.sEdge[this.d]!]) as StepOutcome;
  }

  get onBlock(): Outcome {
    return this.lastStep().onBlock;
  }

  get onHit(): Outcome {
    return this.lastStep().onHit;
  }

  get onCounterHit(): Outcome {
    return this.lastStep().onCounterHit;
  }

  /** The numeric on-block advantage, NaN for a state: cheap to rank by. */
  get onBlockFrames(): number {
    const n = this.sNode[this.d]!;
    return this.g.isMove[n] ? this.g.blockFrames[n]! : this.g.edgeBlockFrames[this.sEdge[this.d]!]!;
  }

  get framesSaved(): number | null {
    const d = this.d;
    const n = this.sNode[d]!;
    if (this.g.isMove[n] || d === 0) return null;
    const saved = this.g.edgeBlockFrames[this.sEdge[d]!]! - this.g.blockFrames[this.sNode[d - 1]!]!;
    return saved === saved ? saved : null;
  }

  get blockClass(): BlockClass {
    return classifyFrames(this.onBlockFrames, this.fastest, this.launchAt);
  }

  get defenderStance(): DefenderStance {
    const hits = this.sMoves[this.d]!;
    return hits > 0 && this.g.level[this.hitNode[hits - 1]!] === LOW ? "crouching" : "standing";
  }

  get naturalCombo(): boolean {
    return this.sCombo[this.d] === 1;
  }

  get jails(): boolean {
    return this.sJail[this.d] === 1;
  }

  get gapCount(): number {
    return this.sGapLen[this.d]!;
  }

  get nodes(): string[] {
    const ids = this.g.nodeIds;
    // Sized up front: a pushed-into array over-allocates, and materialised paths are many.
    const out = new Array<string>(this.d + 1);
    for (let i = 0; i <= this.d; i++) out[i] = ids[this.sNode[i]!]!;
    return out;
  }

  get edges(): readonly string[] {
    if (this.d === 0) return EMPTY;
    const ids = this.g.edgeIds;
    const out = new Array<string>(this.d);
    for (let i = 1; i <= this.d; i++) out[i - 1] = ids[this.sEdge[i]!]!;
    return out;
  }

  get input(): string {
    return this.inputOf(this.d);
  }

  private inputOf(d: number): string {
    if (this.inputStamp[d] === this.sStamp[d]) return this.inputAt[d]!;
    let s: string;
    if (d === 0) {
      const first = this.g.nodes[this.sNode[0]!]!;
      s = first.kind === "move" ? first.input : "";
    } else {
      s = this.inputOf(d - 1) + this.g.edgeInputs[this.sEdge[d]!]!;
    }
    this.inputAt[d] = s;
    this.inputStamp[d] = this.sStamp[d]!;
    return s;
  }

  get levels(): Level[] {
    const hits = this.sMoves[this.d]!;
    const out = new Array<Level>(hits);
    for (let i = 0; i < hits; i++) out[i] = LEVELS[this.g.level[this.hitNode[i]!]!]!;
    return out;
  }

  /** The per-hit guard lists are shared frozen arrays, one per level. */
  get guards(): (readonly Guard[])[] {
    const hits = this.sMoves[this.d]!;
    const out = new Array<readonly Guard[]>(hits);
    for (let i = 0; i < hits; i++) out[i] = GUARDS_BY_CODE[this.g.level[this.hitNode[i]!]!]!;
    return out;
  }

  get gaps(): readonly Readonly<Gap>[] {
    const len = this.sGapLen[this.d]!;
    if (len === 0) return EMPTY;
    const out: Gap[] = [];
    for (let i = 0; i < len; i++) out.push({ after: this.gapAfter[i]!, frames: this.gapFrames[i]! });
    return out;
  }

  get duckable(): readonly number[] {
    const len = this.sDuckLen[this.d]!;
    if (len === 0) return EMPTY;
    const out: number[] = [];
    for (let i = 0; i < len; i++) out.push(this.duckIdx[i]!);
    return out;
  }

  get mixupPoints(): readonly string[] {
    const len = this.sMixLen[this.d]!;
    if (len === 0) return EMPTY;
    const ids = this.g.nodeIds;
    const out: string[] = [];
    for (let i = 0; i < len; i++) out.push(ids[this.mixNode[i]!]!);
    return out;
  }

  get autoGuard(): readonly Level[] {
    const len = this.sAgLen[this.d]!;
    if (len === 0) return EMPTY;
    const out: Level[] = [];
    for (let i = 0; i < len; i++) out.push(LEVELS[this.agOrder[i]!]!);
    return out;
  }

  /** A PathResult of the current path that stays valid after the walk moves on. */
  toResult(): PathResult {
    const step = this.lastStep();
    return {
      nodes: this.nodes,
      edges: this.edges,
      input: this.input,
      levels: this.levels,
      damage: this.damage,
      endsIn: this.endsIn,
      onBlock: step.onBlock,
      onHit: step.onHit,
      onCounterHit: step.onCounterHit,
      framesSaved: this.framesSaved,
      blockClass: this.blockClass,
      defenderStance: this.defenderStance,
      guards: this.guards,
      naturalCombo: this.naturalCombo,
      jails: this.jails,
      gaps: this.gaps,
      duckable: this.duckable,
      mixupPoints: this.mixupPoints,
      autoGuard: this.autoGuard,
    };
  }
}

const GUARDS_BY_CODE: readonly (readonly Guard[])[] = LEVELS.map((level) => GUARDS[level]);
const EMPTY: readonly never[] = Object.freeze([]);

export function createPathWalker(
  graph: MoveGraph | CompiledGraph,
  rootId: string,
  options?: ExploreOptions,
): PathWalker {
  return new PathWalker(graph, rootId, options);
}

/**
 * Every path, streamed. The yielded cursor is the same object each time and changes on
 * the next step: read what you need, or call `toResult()` to keep a path.
 */
export function* iteratePaths(
  graph: MoveGraph | CompiledGraph,
  rootId: string,
  options?: ExploreOptions,
): Generator<PathWalker, void, undefined> {
  const walker = new PathWalker(graph, rootId, options);
  while (walker.advance()) yield walker;
}

export function explorePaths(
  graph: MoveGraph | CompiledGraph,
  rootId: string,
  options?: ExploreOptions,
): PathResult[] {
  const walker = new PathWalker(graph, rootId, options);
  const out: PathResult[] = [];
  while (walker.advance()) out.push(walker.toResult());
  return out;
}

/** At most `limit` paths in walk order; `truncated` says whether any path was left out. */
export function explorePathsLimited(
  graph: MoveGraph | CompiledGraph,
  rootId: string,
  limit: number,
  options?: ExploreOptions,
): { paths: PathResult[]; truncated: boolean } {
  const walker = new PathWalker(graph, rootId, options);
  const paths: PathResult[] = [];
  while (paths.length < limit && walker.advance()) paths.push(walker.toResult());
  const truncated = paths.length >= limit && walker.advance();
  return { paths, truncated };
}

export function countPaths(
  graph: MoveGraph | CompiledGraph,
  rootId: string,
  options?: ExploreOptions,
  filter?: (path: PathWalker) => boolean,
): number {
  const walker = new PathWalker(graph, rootId, options);
  let count = 0;
  if (filter === undefined) {
    while (walker.advance()) count++;
  } else {
    while (walker.advance()) if (filter(walker)) count++;
  }
  return count;
}
