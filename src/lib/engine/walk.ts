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
    throw new EngineInputError(parsed.error.issues.map((i) => `option ${i.path.join(".") || "(root)"}: ${i.message}`));
  }
  return parsed.data;
}

// Per-depth info word: hit count, gap count and the combo and jail flags, so a step
// writes one slot for all four. Hits and gaps are at most MAX_DEPTH_LIMIT (64): 7 bits each.
const HITS = 0x7f;
const GAP_SHIFT = 7;
const GAP_ONE = 1 << GAP_SHIFT;
const COMBO = 1 << 14;
const JAIL = 1 << 15;
const FLAGS = COMBO | JAIL;
if (schema.MAX_DEPTH_LIMIT > HITS) throw new Error("info word too narrow for MAX_DEPTH_LIMIT");

/** What a step into a hit does to the info word: flags it keeps, and one more gap if it leaves one. */
function stepBits(gap: number, combo: boolean): number {
  return (combo ? COMBO : 0) | (gap <= 0 ? JAIL : 0) | (gap > 0 ? GAP_ONE : 0);
}

/**
 * Everything about a graph that is fixed for given `fastest` and `launchAt`, so reading
 * a path's block class or frames saved is one array read. Kept per compiled graph, as a
 * caller may run many short walks (a limited explore, a top-k) over one graph.
 */
interface WalkTables {
  readonly fastest: number;
  readonly launchAt: number;
  /**
   * What a path's end decides, by its tail: move n ends at tail n, a stance entered by
   * the cancel in slot s at tail nodeCount + s. Frames are NaN for a state or none.
   */
  readonly tailClass: readonly BlockClass[];
  readonly tailSaved: Float64Array;
  readonly tailFrames: Float64Array;
  readonly tailOutcome: readonly StepOutcome[];
  /** stepBits of the follow in slot s. */
  readonly followStep: Int32Array;
}

const tablesByGraph = new WeakMap<CompiledGraph, WalkTables[]>();

function walkTables(g: CompiledGraph, fastest: number, launchAt: number): WalkTables {
  let list = tablesByGraph.get(g);
  if (list === undefined) tablesByGraph.set(g, (list = []));
  for (const t of list) if (t.fastest === fastest && t.launchAt === launchAt) return t;
  const nodes = g.nodeCount;
  const tails = nodes + g.slotEdge.length;
  const tailClass = new Array<BlockClass>(tails);
  const tailSaved = new Float64Array(tails).fill(Number.NaN);
  const tailFrames = new Float64Array(tails).fill(Number.NaN);
  // Tails that never end a path (stances, slots that are not cancels) get a move's outcome.
  const tailOutcome = new Array<StepOutcome>(tails);
  const followStep = new Int32Array(g.slotEdge.length);
  const anyOutcome = g.nodeOutcome.find((o) => o !== undefined) as StepOutcome;
  for (let n = 0; n < nodes; n++) {
    tailFrames[n] = g.blockFrames[n]!;
    tailClass[n] = classifyFrames(g.blockFrames[n]!, fastest, launchAt);
    tailOutcome[n] = g.nodeOutcome[n] ?? anyOutcome;
    for (let s = g.slotStart[n]!; s < g.slotStart[n + 1]!; s++) {
      const e = g.slotEdge[s]!;
      tailFrames[nodes + s] = g.edgeBlockFrames[e]!;
      tailClass[nodes + s] = classifyFrames(g.edgeBlockFrames[e]!, fastest, launchAt);
      tailOutcome[nodes + s] = g.edgeOutcome[e] ?? anyOutcome;
      if (g.slotKind[s] === CANCEL) tailSaved[nodes + s] = g.edgeBlockFrames[e]! - g.blockFrames[n]!;
      else if (g.slotKind[s] === FOLLOW) followStep[s] = stepBits(g.edgeGap[e]!, g.edgeCombo[e] === 1);
    }
  }
  const t: WalkTables = { fastest, launchAt, tailClass, tailSaved, tailFrames, tailOutcome, followStep };
  // A handful of option pairs per graph at most in practice; keep the newest few.
  if (list.length >= 4) list.shift();
  list.push(t);
  return t;
}

/**
 * A depth-first walk over every place a path may stop, one place per `advance()`.
 *
 * The walker is itself the cursor: after `advance()` returns true its fields describe the
 * current path. A step deeper writes five slots of per-depth stacks (node, tail, next
 * out-slot, info word, damage) and going back is free. Everything else is derived from those when
 * read: the edge into depth i is the out-slot its parent last took (`sNext[i - 1] - 1`),
 * and lists (gaps, guards, auto-guard...) are rebuilt from the nodes and edges on the
 * path, as only materialising reads them. `toResult()` builds a detached copy.
 */
export class PathWalker implements PathView {
  private readonly g: CompiledGraph;
  private readonly root: number;
  private readonly maxDepth: number;
  private readonly maxStanceVisits: number;

  // The compiled arrays the walk reads, one property load away instead of two.
  private readonly isMove: Uint8Array;
  private readonly level: Uint8Array;
  private readonly nodeDamage: Float64Array;
  private readonly startup: Float64Array;
  private readonly slotStart: Int32Array;
  private readonly slotEdge: Int32Array;
  private readonly slotTo: Int32Array;
  private readonly slotKind: Uint8Array;
  private readonly edgeBlockFrames: Float64Array;
  private readonly edgeHitFrames: Float64Array;
  private readonly tailClass: readonly BlockClass[];
  private readonly tailSaved: Float64Array;
  private readonly tailFrames: Float64Array;
  private readonly tailOutcome: readonly StepOutcome[];
  private readonly followStep: Int32Array;

  /** Index of the path's last node on the stacks; -1 before the first or after the last path. */
  private d = -1;
  private started = false;

  // Per depth.
  private readonly sNode: Int32Array;
  /** The path's end so far, as a WalkTables tail: the end's getters read one table slot. */
  private readonly sTail: Int32Array;
  private readonly sNext: Int32Array;
  private readonly sInfo: Int32Array;
  private readonly sDamage: Float64Array;

  private readonly visits: Int32Array;
  private readonly agOrder: Uint8Array;

  // The input of each depth's path, kept once built: a child's input is its parent's plus
  // one edge, so materialising in walk order costs one string per path. The cache of
  // depth i holds while the out-slots taken at depths 0 .. i - 1 are those it was built
  // on (inputKey[1 .. i]): checked when read, so walking costs nothing for it. Rebuilding
  // depth i voids depth i + 1, so a matching key also means a matching prefix.
  private readonly inputKey: Int32Array;
  private readonly inputAt: string[];

  constructor(graph: MoveGraph | CompiledGraph, rootId: string, options?: ExploreOptions) {
    const g = compileGraph(graph);
    const o = resolveOptions(options);
    this.g = g;
    this.root = g.require(rootId);
    this.maxDepth = o.maxDepth;
    this.maxStanceVisits = o.maxStanceVisits;
    const t = walkTables(g, o.fastest, o.launchAt);
    this.isMove = g.isMove;
    this.level = g.level;
    this.nodeDamage = g.damage;
    this.startup = g.startup;
    this.slotStart = g.slotStart;
    this.slotEdge = g.slotEdge;
    this.slotTo = g.slotTo;
    this.slotKind = g.slotKind;
    this.edgeBlockFrames = g.edgeBlockFrames;
    this.edgeHitFrames = g.edgeHitFrames;
    this.tailClass = t.tailClass;
    this.tailSaved = t.tailSaved;
    this.tailFrames = t.tailFrames;
    this.tailOutcome = t.tailOutcome;
    this.followStep = t.followStep;
    // At most maxDepth moves, each stance is preceded by a move except a stance root.
    const size = 2 * o.maxDepth + 2;
    this.sNode = new Int32Array(size);
    this.sTail = new Int32Array(size);
    this.sNext = new Int32Array(size);
    this.sInfo = new Int32Array(size);
    this.sDamage = new Float64Array(size);
    this.visits = new Int32Array(g.nodeCount);
    this.agOrder = new Uint8Array(LEVELS.length);
    this.inputKey = new Int32Array(size).fill(-1);
    this.inputAt = new Array<string>(size).fill("");
    const first = g.nodes[this.root]!;
    this.inputAt[0] = first.kind === "move" ? first.input : "";
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
    const r = this.root;
    this.sNode[0] = r;
    this.sTail[0] = r;
    this.sNext[0] = this.slotStart[r]!;
    this.d = 0;
    if (this.isMove[r]) {
      this.sInfo[0] = FLAGS | 1;
      this.sDamage[0] = this.nodeDamage[r]!;
      return true;
    }
    // A stance root alone has no hit and so no outcome: it is not a path, only a start.
    if (this.maxStanceVisits < 1) {
      this.d = -1;
      return false;
    }
    this.visits[r] = 1;
    // The path's first hit opens it, with nothing before it to combo or jail with.
    this.sInfo[0] = FLAGS;
    this.sDamage[0] = 0;
    return this.descend();
  }

  // One function for the whole step, pushes included: it runs once per path.
  private descend(): boolean {
    const slotStart = this.slotStart;
    const slotKind = this.slotKind;
    const slotTo = this.slotTo;
    const sNode = this.sNode;
    const sTail = this.sTail;
    const sNext = this.sNext;
    const sInfo = this.sInfo;
    const cancelTail = this.isMove.length;
    const sDamage = this.sDamage;
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
            visits[to]!++;
            sNext[d] = slot + 1;
            sNode[d + 1] = to;
            sTail[d + 1] = cancelTail + slot;
            sNext[d + 1] = slotStart[to]!;
            sInfo[d + 1] = sInfo[d]!;
            sDamage[d + 1] = sDamage[d]!;
            this.d = d + 1;
            return true;
          }
        } else {
          const info = sInfo[d]!;
          if ((info & HITS) < maxDepth) {
            sNext[d] = slot + 1;
            let step: number;
            if ((info & HITS) === 0) step = FLAGS;
            else if (kind === FOLLOW) step = this.followStep[slot]!;
            else step = this.enterStep(sNext[d - 1]! - 1, to);
            sNode[d + 1] = to;
            sTail[d + 1] = to;
            sNext[d + 1] = slotStart[to]!;
            sInfo[d + 1] = (info & (step | ~FLAGS)) + 1 + (step & GAP_ONE);
            sDamage[d + 1] = sDamage[d]! + this.nodeDamage[to]!;
            this.d = d + 1;
            return true;
          }
        }
        slot++;
      }
      if (!this.isMove[n]) visits[n]!--;
      d--;
    }
    this.d = -1;
    return false;
  }

  /**
   * stepBits of an enter into move t right after the cancel in slot c: a follow-up at the
   * cancel's advantage (NaN frames for a state: no gap known, no combo).
   */
  private enterStep(c: number, t: number): number {
    const e = this.slotEdge[c]!;
    const s = this.startup[t]!;
    return stepBits(s - this.edgeBlockFrames[e]! - 1, s <= this.edgeHitFrames[e]!);
  }

  /** Info-word bits of the step into the move at depth i >= 1, when it is not the path's first hit. */
  private stepInto(i: number): number {
    const slot = this.sNext[i - 1]! - 1;
    return this.slotKind[slot] === FOLLOW
      ? this.followStep[slot]!
      : this.enterStep(this.sNext[i - 2]! - 1, this.sNode[i]!);
  }

  /** The gap on block of that step (NaN: none known). */
  private gapInto(i: number): number {
    const slot = this.sNext[i - 1]! - 1;
    const e = this.slotEdge[slot]!;
    if (this.slotKind[slot] === FOLLOW) return this.g.edgeGap[e]!;
    return this.startup[this.sNode[i]!]! - this.edgeBlockFrames[this.slotEdge[this.sNext[i - 2]! - 1]!]! - 1;
  }

  // ---- The current path. Scalars are O(1); arrays are built on read. ----

  /** Number of nodes on the current path. */
  get length(): number {
    return this.d + 1;
  }

  /** Number of hits (move nodes) on the current path. */
  get hitCount(): number {
    return this.sInfo[this.d]! & HITS;
  }

  get damage(): number {
    return this.sDamage[this.d]!;
  }

  get endsIn(): "move" | "stance" {
    return this.isMove[this.sNode[this.d]!] ? "move" : "stance";
  }

  private lastStep(): StepOutcome {
    return this.tailOutcome[this.sTail[this.d]!]!;
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
    return this.tailFrames[this.sTail[this.d]!]!;
  }

  get framesSaved(): number | null {
    const saved = this.tailSaved[this.sTail[this.d]!]!;
    return saved === saved ? saved : null;
  }

  get blockClass(): BlockClass {
    return this.tailClass[this.sTail[this.d]!]!;
  }

  get defenderStance(): DefenderStance {
    const d = this.d;
    if ((this.sInfo[d]! & HITS) === 0) return "standing";
    const n = this.sNode[d]!;
    // A stance on a path is entered by a cancel, right after a hit.
    const last = this.isMove[n] ? n : this.sNode[d - 1]!;
    return this.level[last] === LOW ? "crouching" : "standing";
  }

  get naturalCombo(): boolean {
    return (this.sInfo[this.d]! & COMBO) !== 0;
  }

  get jails(): boolean {
    return (this.sInfo[this.d]! & JAIL) !== 0;
  }

  get gapCount(): number {
    return (this.sInfo[this.d]! >> GAP_SHIFT) & HITS;
  }

  get nodes(): string[] {
    const ids = this.g.nodeIds;
    const d = this.d;
    // Sized up front: a pushed-into array over-allocates, and materialised paths are many.
    const out = new Array<string>(d + 1);
    for (let i = 0; i <= d; i++) out[i] = ids[this.sNode[i]!]!;
    return out;
  }

  get edges(): readonly string[] {
    const d = this.d;
    if (d === 0) return EMPTY;
    const ids = this.g.edgeIds;
    const out = new Array<string>(d);
    for (let i = 1; i <= d; i++) out[i - 1] = ids[this.slotEdge[this.sNext[i - 1]! - 1]!]!;
    return out;
  }

  get input(): string {
    const d = this.d;
    const sNext = this.sNext;
    const key = this.inputKey;
    const at = this.inputAt;
    let i = 1;
    while (i <= d && key[i] === sNext[i - 1]) i++;
    if (i > d) return at[d]!;
    const inputs = this.g.edgeInputs;
    for (; i <= d; i++) {
      const taken = sNext[i - 1]!;
      at[i] = at[i - 1]! + inputs[this.slotEdge[taken - 1]!]!;
      key[i] = taken;
    }
    // Deeper caches were built on the old prefix.
    if (d + 1 < key.length) key[d + 1] = -1;
    return at[d]!;
  }

  get levels(): Level[] {
    const hits = this.sInfo[this.d]! & HITS;
    const out = new Array<Level>(hits);
    let h = 0;
    for (let i = 0; h < hits; i++) {
      const n = this.sNode[i]!;
      if (this.isMove[n]) out[h++] = LEVELS[this.level[n]!]!;
    }
    return out;
  }

  /** The per-hit guard lists are shared frozen arrays, one per level. */
  get guards(): (readonly Guard[])[] {
    const hits = this.sInfo[this.d]! & HITS;
    const out = new Array<readonly Guard[]>(hits);
    let h = 0;
    for (let i = 0; h < hits; i++) {
      const n = this.sNode[i]!;
      if (this.isMove[n]) out[h++] = GUARDS_BY_CODE[this.level[n]!]!;
    }
    return out;
  }

  get gaps(): readonly Readonly<Gap>[] {
    const len = (this.sInfo[this.d]! >> GAP_SHIFT) & HITS;
    if (len === 0) return EMPTY;
    const out = new Array<Gap>(len);
    let k = 0;
    let h = 0;
    for (let i = 0; k < len; i++) {
      if (!this.isMove[this.sNode[i]!]) continue;
      if (h > 0 && (this.stepInto(i) & GAP_ONE) !== 0) out[k++] = { after: h - 1, frames: this.gapInto(i) };
      h++;
    }
    return out;
  }

  get duckable(): readonly number[] {
    const d = this.d;
    // Counted first so the list is allocated at its size: a pushed-into array over-allocates.
    let count = 0;
    for (let i = 0, h = 0; i <= d; i++) {
      const n = this.sNode[i]!;
      if (!this.isMove[n]) continue;
      if (this.level[n] === HIGH && (h === 0 || (this.stepInto(i) & GAP_ONE) !== 0)) count++;
      h++;
    }
    if (count === 0) return EMPTY;
    const out = new Array<number>(count);
    for (let i = 0, h = 0, k = 0; k < count; i++) {
      const n = this.sNode[i]!;
      if (!this.isMove[n]) continue;
      if (this.level[n] === HIGH && (h === 0 || (this.stepInto(i) & GAP_ONE) !== 0)) out[k++] = h;
      h++;
    }
    return out;
  }

  get mixupPoints(): readonly string[] {
    const d = this.d;
    const mixup = this.g.mixup;
    let count = 0;
    for (let i = 0; i <= d; i++) count += mixup[this.sNode[i]!]!;
    if (count === 0) return EMPTY;
    const ids = this.g.nodeIds;
    const out = new Array<string>(count);
    let k = 0;
    for (let i = 0; k < count; i++) {
      const n = this.sNode[i]!;
      if (mixup[n]) out[k++] = ids[n]!;
    }
    return out;
  }

  get autoGuard(): readonly Level[] {
    const d = this.d;
    const g = this.g;
    // Levels in first-seen order, kept in a small buffer, then copied out at their count.
    const order = this.agOrder;
    let count = 0;
    let mask = 0;
    for (let i = 1; i <= d; i++) {
      if (this.isMove[this.sNode[i]!]) continue;
      const e = this.slotEdge[this.sNext[i - 1]! - 1]!;
      const end = g.agStart[e + 1]!;
      for (let k = g.agStart[e]!; k < end; k++) {
        const level = g.agLevels[k]!;
        const bit = 1 << level;
        if ((mask & bit) === 0) {
          mask |= bit;
          order[count++] = level;
        }
      }
    }
    if (count === 0) return EMPTY;
    const out = new Array<Level>(count);
    for (let k = 0; k < count; k++) out[k] = LEVELS[order[k]!]!;
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
  if (filter === undefined) {
    while (walker.advance()) count++;
  } else {
    while (walker.advance()) if (filter(walker)) count++;
  }
  return count;
}
