import {
  BLOCK_CLASS_WORD,
  explainFramesSaved,
  explainGap,
  formatFrames,
  formatOutcome,
  framesSavedLabel,
  gapAtAdvantage,
  gapAtAdvantageSum,
  gapJails,
  type BlockClass,
  type CancelEdge,
  type GraphEdge,
  type GraphNode,
  type Level,
  type MoveGraph,
  type MoveNode,
  type Outcome,
  type PathResult,
} from "@/lib/engine";

/**
 * The frame timeline of one path as positioned segments, in SVG user units that are
 * meant to be drawn at 1 unit = 1 CSS pixel: widths come from the labels' character
 * counts (the labels are monospace), so a picture that is never scaled down stays legible.
 */

export const TIMELINE_HEIGHT = 120;
export const TIMELINE_PAD = 8;
/** Font sizes of the timeline, in px; none below 10 so a phone can read them. */
export const TIMELINE_FONT = { caption: 10, label: 11, figure: 13 } as const;

// JetBrains Mono advances 0.6 em per character.
const ADVANCE = 0.6;
const textWidth = (text: string, size: number) => Math.ceil(text.length * size * ADVANCE);

export type GapStatus = "open" | "jail" | "unknown";

export interface HitSegment {
  kind: "hit";
  /** 0-based index of the hit among the path's hits. */
  index: number;
  nodeId: string;
  /** The root's input for the first hit, else the input of the edge taken into it. */
  label: string;
  level: Level;
  damage: number;
  via: "root" | "follow" | "enter";
  /** The stance the move is done from, for a hit entered from a stance. */
  fromStance: string | null;
  explain: string;
  x: number;
  width: number;
}

export interface GapSegment {
  kind: "gap";
  /** 0-based index of the hit before the gap, as in `PathResult.gaps`. */
  after: number;
  /** Gap on block in frames; null when none is known. */
  frames: number | null;
  status: GapStatus;
  via: "follow" | "enter";
  label: string;
  explain: string;
  x: number;
  width: number;
}

export interface CancelSegment {
  kind: "cancel";
  /** 0-based index of the hit the cancel ends. */
  after: number;
  edgeId: string;
  input: string;
  stance: string;
  /** True when the path stops in this stance. */
  final: boolean;
  onBlock: Outcome;
  /** The on-block outcome of the hit it cancels, had the attacker stopped there. */
  hitOnBlock: Outcome;
  /** The engine's `framesSaved`, only for the final cancel. */
  framesSaved: number | null;
  autoGuard: readonly Level[];
  explain: string;
  x: number;
  width: number;
}

/** The stance a path starts in, when its root is a stance. */
export interface StartSegment {
  kind: "start";
  stance: string;
  explain: string;
  x: number;
  width: number;
}

export interface EndSegment {
  kind: "end";
  endsIn: "move" | "stance";
  onBlock: Outcome;
  onHit: Outcome;
  onCounterHit: Outcome;
  blockClass: BlockClass;
  /** The words printed beside each outcome; `blockWord` is the class in words. */
  blockWord: string;
  /** Where the end's outcomes come from, in words, for the explanations. */
  source: string;
  /** 0-based index of the path's last hit. */
  lastHit: number;
  /** The input of the cancel the path ends with, if it does. */
  cancelInput: string | null;
  x: number;
  /** Width of the on-block box; `width` also covers the on-hit rows under it. */
  boxWidth: number;
  width: number;
}

export type TimelineSegment = HitSegment | GapSegment | CancelSegment | StartSegment | EndSegment;

const hitOrdinal = (i: number) => `hit ${i + 1}`;

/** How a step into a hit gets its gap on block, per DESIGN.md "Path semantics". */
function stepGap(
  edge: GraphEdge,
  target: MoveNode,
  cancelBefore: CancelEdge | null,
): { frames: number | null; why: string; via: "follow" | "enter" } {
  if (edge.kind === "follow") {
    return { frames: edge.gapOnBlock, via: "follow", why: "the string's data gives it" };
  }
  if (cancelBefore === null) {
    return {
      frames: null,
      via: "enter",
      why: "the stance move has no cancel before it on the path, so nothing fixes its timing",
    };
  }
  const a = cancelBefore.onBlock;
  if (typeof a !== "number") {
    return {
      frames: null,
      via: "enter",
      why: `the cancel ${cancelBefore.input} leaves ${formatOutcome(a)} on block, a state, not a frame count`,
    };
  }
  if (target.startup === undefined) {
    return { frames: null, via: "enter", why: `the stance move ${edge.input} has no startup in the data` };
  }
  const s = target.startup;
  return {
    frames: gapAtAdvantage(a, s),
    via: "enter",
    why: `the stance move ${edge.input} (startup ${s}) starts from the cancel's ${formatFrames(a)} on block: ${gapAtAdvantageSum(a, s)}`,
  };
}

function gapWords(
  after: number,
  frames: number | null,
  why: string,
): { status: GapStatus; label: string; explain: string } {
  const where = `after ${hitOrdinal(after)}`;
  if (frames === null) {
    return { status: "unknown", label: "? no gap known", explain: `No gap on block known ${where}: ${why}.` };
  }
  const explain = `Gap on block ${where}: ${why}. ${explainGap(frames)}.`;
  return gapJails(frames)
    ? { status: "jail", label: "jail", explain }
    : { status: "open", label: `${frames}f gap`, explain };
}

function endBoxWidth(end: Pick<EndSegment, "onBlock" | "blockWord">): number {
  return (
    Math.max(
      textWidth(formatOutcome(end.onBlock), TIMELINE_FONT.figure),
      textWidth(end.blockWord, TIMELINE_FONT.label),
      textWidth("on block", TIMELINE_FONT.caption),
    ) + 20
  );
}

function endWidth(end: Pick<EndSegment, "onBlock" | "onHit" | "onCounterHit" | "blockWord">): number {
  return Math.max(
    endBoxWidth(end),
    textWidth(`on hit ${formatOutcome(end.onHit)}`, TIMELINE_FONT.label) + 12,
    textWidth(`on counter hit ${formatOutcome(end.onCounterHit)}`, TIMELINE_FONT.label) + 12,
  );
}

/**
 * The segments of a path's timeline, left to right. Figures the engine reports
 * (`gaps`, `framesSaved`, `blockClass`, the outcomes) are taken from `path`; the graph
 * only supplies what the engine does not return per step: the labels, and the gaps of
 * jails and of steps whose gap is unknown.
 */
export function timelineSegments(path: PathResult, graph: MoveGraph): TimelineSegment[] {
  const nodes = new Map<string, GraphNode>(graph.nodes.map((n) => [n.id, n]));
  const edges = new Map<string, GraphEdge>(graph.edges.map((e) => [e.id, e]));
  const engineGaps = new Map(path.gaps.map((g) => [g.after, g.frames]));
  const out: TimelineSegment[] = [];
  let x = TIMELINE_PAD;
  const place = <S extends TimelineSegment>(seg: Omit<S, "x">): void => {
    out.push({ ...seg, x } as S);
    x += seg.width;
  };

  let hits = 0;
  let lastMove: MoveNode | null = null;
  let cancelBefore: CancelEdge | null = null;
  let stanceName: string | null = null;

  path.nodes.forEach((id, i) => {
    const node = nodes.get(id);
    if (node === undefined) throw new Error(`timeline: node "${id}" of the path is not in the graph`);
    const edge = i === 0 ? null : edges.get(path.edges[i - 1] ?? "");
    if (i > 0 && edge === undefined) throw new Error(`timeline: edge ${i - 1} of the path is not in the graph`);

    if (node.kind === "stance") {
      stanceName = node.name;
      if (edge === null || edge === undefined) {
        const label = `from ${node.name}`;
        place<StartSegment>({
          kind: "start",
          stance: node.name,
          explain: `The path starts in the stance ${node.name}; its first hit is a move done from it.`,
          width: textWidth(label, TIMELINE_FONT.label) + 16,
        });
        return;
      }
      if (edge.kind !== "cancel" || lastMove === null) return;
      cancelBefore = edge;
      const final = i === path.nodes.length - 1;
      const framesSaved = final ? path.framesSaved : null;
      const after = hits - 1;
      const guard =
        edge.autoGuard.length > 0 ? ` During the transition it auto-guards ${edge.autoGuard.join(", ")}.` : "";
      const explain = final
        ? `Cancel ${edge.input} into ${node.name} after ${hitOrdinal(after)}. ${explainFramesSaved(edge.onBlock, lastMove.onBlock)}${guard}`
        : typeof edge.onBlock === "number"
          ? `Cancel ${edge.input} into ${node.name} after ${hitOrdinal(after)}: it leaves ${formatOutcome(edge.onBlock)} on block, the advantage the next stance move starts from.${guard}`
          : `Cancel ${edge.input} into ${node.name} after ${hitOrdinal(after)}: it leaves ${formatOutcome(edge.onBlock)} on block, a state, so no gap can be counted before the next stance move.${guard}`;
      const saved = framesSaved === null ? "" : framesSavedLabel(framesSaved);
      place<CancelSegment>({
        kind: "cancel",
        after,
        edgeId: edge.id,
        input: edge.input,
        stance: node.name,
        final,
        onBlock: edge.onBlock,
        hitOnBlock: lastMove.onBlock,
        framesSaved,
        autoGuard: edge.autoGuard,
        explain,
        width:
          Math.max(
            textWidth(edge.input, TIMELINE_FONT.figure),
            textWidth(node.name, TIMELINE_FONT.caption),
            textWidth(saved, TIMELINE_FONT.label),
            textWidth("cancel", TIMELINE_FONT.caption),
          ) + 20,
      });
      return;
    }

    const index = hits;
    // A hit entered from a stance the path started in opens the path: no step, no gap.
    if (index > 0 && edge !== null && edge !== undefined) {
      const step = stepGap(edge, node, edge.kind === "enter" ? cancelBefore : null);
      const engine = engineGaps.get(index - 1);
      const frames = engine ?? step.frames;
      const words = gapWords(index - 1, frames, step.why);
      place<GapSegment>({
        kind: "gap",
        after: index - 1,
        frames,
        status: words.status,
        via: step.via,
        label: words.label,
        explain: words.explain,
        width: Math.max(textWidth(words.label, TIMELINE_FONT.label) + 12, words.status === "jail" ? 40 : 52),
      });
    }
    const label = edge === null || edge === undefined ? node.input : edge.input;
    const via = edge === null || edge === undefined ? "root" : edge.kind === "follow" ? "follow" : "enter";
    const fromStance = via === "enter" ? stanceName : null;
    const how =
      via === "root"
        ? `the path's first hit, entered as ${node.input}`
        : via === "follow"
          ? `the next hit of the string, entered as ${label} after ${hitOrdinal(index - 1)}`
          : `a move done from ${fromStance ?? "the stance"}, entered as ${label}`;
    place<HitSegment>({
      kind: "hit",
      index,
      nodeId: node.id,
      label,
      level: node.level,
      damage: node.damage,
      via,
      fromStance,
      explain: `Hit ${index + 1} (${node.name ?? node.input}): ${how}. Level ${node.level}${path.guards[index] ? `, stopped by ${path.guards[index].join(" or ")}` : ""}; damage ${node.damage}.`,
      width:
        Math.max(
          textWidth(label, TIMELINE_FONT.figure),
          textWidth(node.level, TIMELINE_FONT.caption),
          textWidth("hit 00", TIMELINE_FONT.caption),
        ) + 16,
    });
    hits++;
    lastMove = node;
    cancelBefore = null;
  });

  const lastHit = hits - 1;
  const last = out[out.length - 1];
  const finalCancel = path.endsIn === "stance" && last?.kind === "cancel" ? last : null;
  const source =
    finalCancel === null
      ? `${hitOrdinal(lastHit)}, the hit the path stops at`
      : `the cancel ${finalCancel.input} into ${finalCancel.stance} after ${hitOrdinal(lastHit)} (a cancel's own outcome replaces the hit's)`;
  const blockWord = BLOCK_CLASS_WORD[path.blockClass];
  const end = { onBlock: path.onBlock, onHit: path.onHit, onCounterHit: path.onCounterHit, blockWord };
  place<EndSegment>({
    kind: "end",
    endsIn: path.endsIn,
    ...end,
    blockClass: path.blockClass,
    source,
    lastHit,
    cancelInput: finalCancel?.input ?? null,
    boxWidth: endBoxWidth(end),
    width: endWidth(end) + 12,
  });
  return out;
}

/** The width the segments need, padding included: the SVG's viewBox width. */
export function timelineWidth(segments: readonly TimelineSegment[]): number {
  const last = segments[segments.length - 1];
  return (last === undefined ? 0 : last.x + last.width) + TIMELINE_PAD;
}
