import { CANCEL, FOLLOW, CompiledGraph, EngineInputError, compileGraph, type StepOutcome } from "./compile";
import * as frames from "./frames";
import { GUARDS, defenderStanceAfter } from "./frames";
import { LEVELS, optionsSchema } from "./schema";
import type {
  BlockClass,
  CancelEdge,
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

export function resolveOptions(options?: ExploreOptions): ResolvedOptions {
  const parsed = optionsSchema.safeParse(options ?? {});
  if (!parsed.success) {
    throw new EngineInputError(parsed.error.issues.map((i) => `option ${i.path.join(".") || "(root)"}: ${i.message}`));
  }
  return parsed.data;
}

// The frame rules the walk calls once per path, as module-local bindings. Where imports
// compile to getters (tsx, vitest), a call through one is not inlined and its number
// arguments and result are boxed: streaming 10^6 paths took 107-123 ms that way against
// 60-72 ms with these bindings (the bench's stream case, runs interleaved).
const classifyFrames = frames.classifyFrames;
const combosAtAdvantage = frames.combosAtAdvantage;
const framesSavedBetween = frames.framesSavedBetween;
const gapAtAdvantage = frames.gapAtAdvantage;
const gapJails = frames.gapJails;
const gapOpens = frames.gapOpens;

const EMPTY: readonly never[] = Object.freeze([]);

/** A list at its own size: an array grown by push keeps spare room, and materialised paths are many. */
function sized<T>(list: T[]): readonly T[] {
  return list.length === 0 ? EMPTY : list.slice();
}

/**
 * The last walker made. Keeping one alive keeps V8's hidden class of walkers alive: when a
 * garbage collection finds no walker, it drops the class and the optimised walk compiled
 * for it, and the next walk starts over in the interpreter (streaming 10^6 paths after a
 * collection: 102-143 ms without, 60-72 ms with). It holds the last graph walked until
 * the next walk.
 */
const lastWalker: PathWalker[] = [];

/**
 * A depth-first walk over every place a path may stop (DESIGN.md, "Path semantics"), one
 * place per `advance()`.
 *
 * The walker is itself the cursor: after `advance()` returns true its getters describe the
 * current path, the nodes at depths 0 .. d. Per depth it keeps the node, the next out-slot
 * to try, and the running annotations a filter or a ranking reads (hits, damage, gap
 * count, combo and jail), so those are one read and going back costs nothing. The lists
 * (gaps, duckable, guards, mix-up points, auto-guard...) are rebuilt from the path's nodes
 * and edges when read, as only materialising reads them. `toResult()` builds a detached copy.
 */
/** Whether a walk leaves out the step from its node at depth d by `edge` to `to`, with `hits` hits so far (`PathWalker.passOver`). */
export type PassOver = (d: number, edge: number, to: number, hits: number) => boolean;

export class PathWalker implements PathView {
  private readonly g: CompiledGraph;
  private readonly root: number;
  private readonly maxDepth: number;
  private readonly maxStanceVisits: number;
  private readonly fastest: number;
  private readonly launchAt: number;

  /** Depth of the path's last node; -1 before the first path and after the last. */
  private d = -1;
  private started = false;

  // Per depth i: the node there, and the path up to it.
  private readonly nodeAt: Int32Array;
  /** The next out-slot of the node at depth i to try; the slot taken into depth i + 1 is one before it. */
  private readonly nextSlotAt: Int32Array;
  private readonly hitsAt: Int32Array;
  private readonly damageAt: Float64Array;
  /** The gap on block of the step into the hit at depth i (NaN: none known, a stance, or the first hit). */
  private readonly gapAt: Float64Array;
  /** Steps into a hit that leave a gap. */
  private readonly gapCountAt: Int32Array;
  /** 1 while every step into a hit after the first combos on hit. */
  private readonly comboAt: Uint8Array;
  /** 1 while every step into a hit after the first jails. */
  private readonly jailAt: Uint8Array;
  /** On-block advantage of the path ending at depth i: its move's, or the cancel's into its stance (NaN: a state). */
  private readonly onBlockAt: Float64Array;

  /** Times each stance is on the current path. */
  private readonly visits: Int32Array;

  /**
   * The input of the path up to each depth: a child's is its parent's plus one edge's, so
   * materialising in walk order builds one string per path. inputAt[0 .. inputBuilt] belong
   * to the current path; a step to depth i leaves 0 .. i - 1 of them standing.
   */
  private readonly inputAt: string[];
  private inputBuilt = 0;

  /** Steps the walk passes over as if their edge were not there (`passOver`); null: none. */
  private passOverStep: PassOver | null = null;

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
    this.nodeAt = new Int32Array(size);
    this.nextSlotAt = new Int32Array(size);
    this.hitsAt = new Int32Array(size);
    this.damageAt = new Float64Array(size);
    this.gapAt = new Float64Array(size);
    this.gapCountAt = new Int32Array(size);
    this.comboAt = new Uint8Array(size);
    this.jailAt = new Uint8Array(size);
    this.onBlockAt = new Float64Array(size);
    this.visits = new Int32Array(g.nodeCount);
    this.inputAt = new Array<string>(size).fill("");
    const first = g.nodes[this.root]!;
    this.inputAt[0] = first.kind === "move" ? first.input : "";
    lastWalker[0] = this;
  }

  /** Moves to the next path; false when every path has been visited. */
  advance(): boolean {
    if (!this.started) {
      this.started = true;
      return this.start();
    }
    return this.d >= 0 && this.nextPath();
  }

  /**
   * Leaves out every path that extends the current one: the next `advance()` goes on as if
   * the current path's last node had no edges left to take. Call it after `advance()` returned true.
   */
  skipExtensions(): void {
    this.nextSlotAt[this.d] = this.g.slotStart[this.nodeAt[this.d]! + 1]!;
  }

  /**
   * From now on, leaves out every path that goes on from the current path's node at depth d by
   * `edge` (a compiled index) to node `to`, where `pass(d, edge, to, hits)` says so (`hits`: the
   * hits on the path up to depth d), with all that extend it. The next `advance()` and every
   * later one ask it before each step.
   */
  passOver(pass: PassOver): void {
    this.passOverStep = pass;
  }

  /** The first path: the root move alone, or for a stance root the first hit after it. */
  private start(): boolean {
    const g = this.g;
    const r = this.root;
    this.d = 0;
    this.nodeAt[0] = r;
    this.nextSlotAt[0] = g.slotStart[r]!;
    this.hitsAt[0] = g.isMove[r]!;
    this.damageAt[0] = g.damage[r]!;
    this.onBlockAt[0] = g.blockFrames[r]!;
    this.gapAt[0] = Number.NaN;
    this.gapCountAt[0] = 0;
    this.comboAt[0] = 1;
    this.jailAt[0] = 1;
    if (g.isMove[r]) return true;
    // A stance root alone has no hit and so no outcome: it is not a path, only a start.
    if (this.maxStanceVisits < 1) {
      this.d = -1;
      return false;
    }
    this.visits[r] = 1;
    return this.nextPath();
  }

  /** One step of the depth-first order: deeper by the next edge the bounds allow, else back up and try again. */
  private nextPath(): boolean {
    const g = this.g;
    for (let d = this.d; d >= 0; d--) {
      const n = this.nodeAt[d]!;
      const end = g.slotStart[n + 1]!;
      for (let slot = this.nextSlotAt[d]!; slot < end; slot++) {
        if (this.mayTake(d, slot) && !this.passesOver(d, slot)) {
          this.nextSlotAt[d] = slot + 1;
          this.stepTo(d + 1, g.slotTo[slot]!);
          return true;
        }
      }
      if (!g.isMove[n]) this.visits[n]!--;
    }
    this.d = -1;
    return false;
  }

  /** The bounds: a move while the path has fewer than maxDepth hits, a stance while it is on the path fewer than maxStanceVisits times. */
  private mayTake(d: number, slot: number): boolean {
    const to = this.g.slotTo[slot]!;
    return this.g.isMove[to] ? this.hitsAt[d]! < this.maxDepth : this.visits[to]! < this.maxStanceVisits;
  }

  private passesOver(d: number, slot: number): boolean {
    const pass = this.passOverStep;
    return pass !== null && pass(d, this.g.slotEdge[slot]!, this.g.slotTo[slot]!, this.hitsAt[d]!);
  }

  /** Puts node `to` at depth i, reached from depth i - 1, with the path's running annotations there. */
  private stepTo(i: number, to: number): void {
    const g = this.g;
    this.d = i;
    this.nodeAt[i] = to;
    this.nextSlotAt[i] = g.slotStart[to]!;
    if (this.inputBuilt >= i) this.inputBuilt = i - 1;
    if (g.isMove[to]) {
      this.addHit(i);
    } else {
      this.visits[to]!++;
      this.keepAnnotations(i);
    }
  }

  /** The hit at depth i: its damage, and what the step into it does to the combo, the jail and the gaps. */
  private addHit(i: number): void {
    const before = i - 1;
    const hit = this.nodeAt[i]!;
    this.hitsAt[i] = this.hitsAt[before]! + 1;
    this.damageAt[i] = this.damageAt[before]! + this.g.damage[hit]!;
    this.onBlockAt[i] = this.g.blockFrames[hit]!;
    if (this.hitsAt[before] === 0) {
      // The path's first hit (after a stance root) opens it: nothing before it to combo or jail with.
      this.gapAt[i] = Number.NaN;
      this.gapCountAt[i] = 0;
      this.comboAt[i] = 1;
      this.jailAt[i] = 1;
      return;
    }
    const gap = this.gapInto(i);
    this.gapAt[i] = gap;
    this.gapCountAt[i] = this.gapCountAt[before]! + (gapOpens(gap) ? 1 : 0);
    this.comboAt[i] = this.comboAt[before] === 1 && this.combosInto(i) ? 1 : 0;
    this.jailAt[i] = this.jailAt[before] === 1 && gapJails(gap) ? 1 : 0;
  }

  /** A stance at depth i: no hit, so the path's annotations stay those of depth i - 1, but for the cancel's advantage. */
  private keepAnnotations(i: number): void {
    const before = i - 1;
    this.onBlockAt[i] = this.g.edgeBlockFrames[this.edgeInto(i)]!;
    this.gapAt[i] = Number.NaN;
    this.hitsAt[i] = this.hitsAt[before]!;
    this.damageAt[i] = this.damageAt[before]!;
    this.gapCountAt[i] = this.gapCountAt[before]!;
    this.comboAt[i] = this.comboAt[before]!;
    this.jailAt[i] = this.jailAt[before]!;
  }

  // ---- The steps of the current path, by depth. ----

  /** The out-slot taken into depth i >= 1. */
  private slotInto(i: number): number {
    return this.nextSlotAt[i - 1]! - 1;
  }

  /** The edge taken into depth i >= 1. */
  private edgeInto(i: number): number {
    return this.g.slotEdge[this.slotInto(i)]!;
  }

  /** The cancel right before the step into depth i, or -1: only cancels lead into a stance. */
  private cancelBefore(i: number): number {
    return i >= 2 && !this.g.isMove[this.nodeAt[i - 1]!] ? this.edgeInto(i - 1) : -1;
  }

  /**
   * The gap on block of the step into the hit at depth i (NaN: none known): a follow's own,
   * or for an enter after a cancel that of a follow-up at the cancel's advantage.
   */
  private gapInto(i: number): number {
    const g = this.g;
    const slot = this.slotInto(i);
    if (g.slotKind[slot] === FOLLOW) return g.edgeGap[g.slotEdge[slot]!]!;
    const cancel = this.cancelBefore(i);
    return cancel < 0 ? Number.NaN : gapAtAdvantage(g.edgeBlockFrames[cancel]!, g.startup[this.nodeAt[i]!]!);
  }

  /** Whether the step into the hit at depth i combos on hit: as gapInto, with the cancel's on-hit advantage. */
  private combosInto(i: number): boolean {
    const g = this.g;
    const slot = this.slotInto(i);
    if (g.slotKind[slot] === FOLLOW) return g.edgeCombo[g.slotEdge[slot]!] === 1;
    const cancel = this.cancelBefore(i);
    return cancel >= 0 && combosAtAdvantage(g.edgeHitFrames[cancel]!, g.startup[this.nodeAt[i]!]!);
  }

  private isHitAt(i: number): boolean {
    return this.g.isMove[this.nodeAt[i]!] === 1;
  }

  private levelAt(i: number): Level {
    return LEVELS[this.g.level[this.nodeAt[i]!]!]!;
  }

  /** Depth of the path's last hit: the last node, or the move before a stance it ends in. */
  private lastHitDepth(): number {
    return this.isHitAt(this.d) ? this.d : this.d - 1;
  }

  // ---- The current path: one getter per field. ----

  /** Number of nodes on the current path. */
  get length(): number {
    return this.d + 1;
  }

  /** Number of hits (move nodes) on the current path. */
  get hitCount(): number {
    return this.hitsAt[this.d]!;
  }

  get damage(): number {
    return this.damageAt[this.d]!;
  }

  get endsIn(): "move" | "stance" {
    return this.isHitAt(this.d) ? "move" : "stance";
  }

  /** The last step's outcome: the last move's, or the cancel's when the path ends in a stance. */
  private lastStep(): StepOutcome {
    const d = this.d;
    return this.isHitAt(d) ? this.g.nodeOutcome[this.nodeAt[d]!]! : this.g.edgeOutcome[this.edgeInto(d)]!;
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

  /** The numeric on-block advantage of the last step, NaN for a state: cheap to rank by. */
  get onBlockFrames(): number {
    return this.onBlockAt[this.d]!;
  }

  /** A path ending in a stance ends in a cancel right after its last move. */
  get framesSaved(): number | null {
    const d = this.d;
    if (this.isHitAt(d)) return null;
    const saved = framesSavedBetween(this.onBlockAt[d]!, this.onBlockAt[d - 1]!);
    return saved === saved ? saved : null;
  }

  get blockClass(): BlockClass {
    return classifyFrames(this.onBlockFrames, this.fastest, this.launchAt);
  }

  get defenderStance(): DefenderStance {
    return defenderStanceAfter(this.levelAt(this.lastHitDepth()));
  }

  get naturalCombo(): boolean {
    return this.comboAt[this.d] === 1;
  }

  get jails(): boolean {
    return this.jailAt[this.d] === 1;
  }

  get gapCount(): number {
    return this.gapCountAt[this.d]!;
  }

  /** The id of the current path's node at 0-based position i (below `length`), read without building `nodes`. */
  nodeIdAt(i: number): string {
    return this.g.nodeIds[this.nodeAt[i]!]!;
  }

  /** The id of the current path's edge at 0-based position i (below `length - 1`), read without building `edges`. */
  edgeIdAt(i: number): string {
    return this.g.edgeIds[this.edgeInto(i + 1)]!;
  }

  /** The compiled index of the current path's node at position i: what `nodeIdAt` names. */
  nodeIndexAt(i: number): number {
    return this.nodeAt[i]!;
  }

  /** The compiled index of the current path's edge at position i: what `edgeIdAt` names. */
  edgeIndexAt(i: number): number {
    return this.edgeInto(i + 1);
  }

  get nodes(): string[] {
    const out = new Array<string>(this.d + 1);
    for (let i = 0; i <= this.d; i++) out[i] = this.g.nodeIds[this.nodeAt[i]!]!;
    return out;
  }

  get edges(): readonly string[] {
    if (this.d === 0) return EMPTY;
    const out = new Array<string>(this.d);
    for (let i = 1; i <= this.d; i++) out[i - 1] = this.g.edgeIds[this.edgeInto(i)]!;
    return out;
  }

  get input(): string {
    for (let i = this.inputBuilt + 1; i <= this.d; i++) {
      this.inputAt[i] = this.inputAt[i - 1]! + this.g.edgeInputs[this.edgeInto(i)]!;
    }
    if (this.inputBuilt < this.d) this.inputBuilt = this.d;
    return this.inputAt[this.d]!;
  }

  /** The depths of the path's hits, in order. */
  private hitDepths(): number[] {
    const out = new Array<number>(this.hitsAt[this.d]!);
    for (let i = 0, h = 0; i <= this.d; i++) if (this.isHitAt(i)) out[h++] = i;
    return out;
  }

  get levels(): Level[] {
    return this.hitDepths().map((i) => this.levelAt(i));
  }

  /** The per-hit guard lists are the shared frozen arrays of frames.ts, one per level. */
  get guards(): (readonly Guard[])[] {
    return this.hitDepths().map((i) => GUARDS[this.levelAt(i)]);
  }

  get gaps(): readonly Readonly<Gap>[] {
    if (this.gapCount === 0) return EMPTY;
    const hits = this.hitDepths();
    const out: Gap[] = [];
    for (let h = 1; h < hits.length; h++) {
      const gap = this.gapAt[hits[h]!]!;
      if (gapOpens(gap)) out.push({ after: h - 1, frames: gap });
    }
    return sized(out);
  }

  get duckable(): readonly number[] {
    const hits = this.hitDepths();
    const out: number[] = [];
    for (let h = 0; h < hits.length; h++) {
      const i = hits[h]!;
      if (this.levelAt(i) === "high" && (h === 0 || gapOpens(this.gapAt[i]!))) out.push(h);
    }
    return sized(out);
  }

  get mixupPoints(): readonly string[] {
    const out: string[] = [];
    for (let i = 0; i <= this.d; i++) {
      const n = this.nodeAt[i]!;
      if (this.g.mixup[n]) out.push(this.g.nodeIds[n]!);
    }
    return sized(out);
  }

  get autoGuard(): readonly Level[] {
    const out: Level[] = [];
    for (let i = 1; i <= this.d; i++) {
      if (this.g.slotKind[this.slotInto(i)] !== CANCEL) continue;
      const cancel = this.g.edges[this.edgeInto(i)] as CancelEdge;
      for (const level of cancel.autoGuard) if (!out.includes(level)) out.push(level);
    }
    return sized(out);
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

export function explorePaths(graph: MoveGraph | CompiledGraph, rootId: string, options?: ExploreOptions): PathResult[] {
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
  while (walker.advance()) if (filter === undefined || filter(walker)) count++;
  return count;
}
