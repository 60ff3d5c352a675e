"use client";

import { memo, useState, type JSX, type ReactNode } from "react";
import {
  BLOCK_CLASS_WORD,
  classifyBlock,
  explainAdvantage,
  explainBlockClass,
  formatOutcome,
  framesSavedLabel,
  type BlockClass,
  type BlockRules,
  type Level,
  type MoveGraph,
  type PathResult,
} from "@/lib/engine";
import {
  TIMELINE_FONT,
  TIMELINE_HEIGHT,
  timelineSegments,
  timelineWidth,
  type CancelSegment,
  type EndSegment,
  type GapSegment,
  type HitSegment,
  type StartSegment,
} from "@/lib/timeline";

// Whole class names, so Tailwind finds them when it scans the source.
const LEVEL_STROKE: Record<Level, string> = {
  high: "stroke-level-high",
  mid: "stroke-level-mid",
  low: "stroke-level-low",
  "special-mid": "stroke-level-special-mid",
  throw: "stroke-level-throw",
  unblockable: "stroke-level-unblockable",
};
const LEVEL_TEXT: Record<Level, string> = {
  high: "fill-level-high",
  mid: "fill-level-mid",
  low: "fill-level-low",
  "special-mid": "fill-level-special-mid",
  throw: "fill-level-throw",
  unblockable: "fill-level-unblockable",
};
const BLOCK_STROKE: Record<BlockClass, string> = {
  plus: "stroke-block-plus",
  even: "stroke-block-even",
  safe: "stroke-block-safe",
  punishable: "stroke-block-punishable",
  "launch-punishable": "stroke-block-launch-punishable",
  state: "stroke-block-state",
};
const BLOCK_TEXT: Record<BlockClass, string> = {
  plus: "fill-block-plus",
  even: "fill-block-even",
  safe: "fill-block-safe",
  punishable: "fill-block-punishable",
  "launch-punishable": "fill-block-launch-punishable",
  state: "fill-block-state",
};

// Rows of the picture, in px (the SVG is drawn at 1 unit = 1 px).
const CAPTION_Y = 13;
const BOX_TOP = 20;
const BOX_H = 44;
const MID_Y = BOX_TOP + BOX_H / 2;
const FIGURE_Y = 39;
const WORD_Y = 56;
const BELOW_Y = 80;
const ON_HIT_Y = 84;
const ON_CH_Y = 102;

function explainEnd(end: EndSegment, cancel: CancelSegment | null, rules: BlockRules): string {
  const parts = [
    `On block: ${formatOutcome(end.onBlock)}, from ${end.source}.`,
    explainBlockClass(end.blockClass, end.onBlock, rules),
  ];
  if (cancel !== null) {
    const raw = cancel.hitOnBlock;
    parts.push(
      `Stopping at the hit instead of cancelling: ${formatOutcome(raw)} (${BLOCK_CLASS_WORD[classifyBlock(raw, rules)]}).`,
    );
  }
  // The engine classified with the options the paths were explored with; say so if these differ.
  const now = classifyBlock(end.onBlock, rules);
  if (now !== end.blockClass) {
    parts.push(
      `With fastest ${rules.fastest}f and launch at ${rules.launchAt}f it would be ${BLOCK_CLASS_WORD[now]}: the paths were computed with other rules.`,
    );
  }
  return parts.join(" ");
}

function explainOutcome(what: "hit" | "counter hit", o: PathResult["onHit"], end: EndSegment): string {
  const lands = what === "hit" ? "lands" : "lands as a counter hit";
  const cancelled = end.cancelInput === null ? "" : ` and is cancelled with ${end.cancelInput}`;
  return `On ${what}: ${formatOutcome(o)}. If hit ${end.lastHit + 1} ${lands}${cancelled}, ${explainAdvantage(o)}.`;
}

/** A labelled figure: focusable, with its explanation as tooltip and accessible description. */
function Figure({
  id,
  label,
  explain,
  box,
  onActive,
  data,
  children,
}: {
  id: string;
  label: string;
  explain: string;
  box: { x: number; y: number; width: number; height: number };
  onActive: (id: string, on: boolean) => void;
  data?: Record<`data-${string}`, string | number>;
  children: ReactNode;
}) {
  return (
    <g
      tabIndex={0}
      role="img"
      aria-label={label}
      className="group cursor-help outline-none"
      onFocus={() => onActive(id, true)}
      onBlur={() => onActive(id, false)}
      onMouseEnter={() => onActive(id, true)}
      onMouseLeave={() => onActive(id, false)}
      {...data}
    >
      <title>{explain}</title>
      {/* Transparent, not unfilled: it is what catches the pointer between the strokes. */}
      <rect
        {...box}
        rx={6}
        className="fill-transparent stroke-accent opacity-0 group-focus-visible:opacity-100"
        strokeWidth={1.5}
      />
      {children}
    </g>
  );
}

function Hit({ seg, onActive }: { seg: HitSegment; onActive: (id: string, on: boolean) => void }) {
  const cx = seg.x + seg.width / 2;
  return (
    <Figure
      id={`hit-${seg.index}`}
      label={`Hit ${seg.index + 1}: ${seg.label}, ${seg.level}`}
      explain={seg.explain}
      box={{ x: seg.x + 1, y: 2, width: seg.width - 2, height: BOX_TOP + BOX_H }}
      onActive={onActive}
      data={{ "data-hit": seg.index, "data-level": seg.level }}
    >
      <text x={cx} y={CAPTION_Y} textAnchor="middle" fontSize={TIMELINE_FONT.caption} className="fill-ink-400">
        hit {seg.index + 1}
      </text>
      <rect
        x={seg.x + 4}
        y={BOX_TOP}
        width={seg.width - 8}
        height={BOX_H}
        rx={4}
        strokeWidth={2}
        className={`fill-ink-850 ${LEVEL_STROKE[seg.level]}`}
      />
      <text x={cx} y={FIGURE_Y} textAnchor="middle" fontSize={TIMELINE_FONT.figure} className="fill-ink-100">
        {seg.label}
      </text>
      <text
        x={cx}
        y={WORD_Y}
        textAnchor="middle"
        fontSize={TIMELINE_FONT.caption}
        className={`uppercase ${LEVEL_TEXT[seg.level]}`}
      >
        {seg.level}
      </text>
    </Figure>
  );
}

function Gap({ seg, onActive }: { seg: GapSegment; onActive: (id: string, on: boolean) => void }) {
  const cx = seg.x + seg.width / 2;
  const x1 = seg.x;
  const x2 = seg.x + seg.width;
  const aria =
    seg.status === "open"
      ? `${seg.frames}f gap after hit ${seg.after + 1}`
      : seg.status === "jail"
        ? `jail after hit ${seg.after + 1}, gap ${seg.frames}f`
        : `no gap known after hit ${seg.after + 1}`;
  return (
    <Figure
      id={`gap-${seg.after}`}
      label={aria}
      explain={seg.explain}
      box={{ x: seg.x + 1, y: BOX_TOP, width: seg.width - 2, height: BOX_H }}
      onActive={onActive}
      data={{ "data-gap-after": seg.after, "data-gap": seg.status }}
    >
      {seg.status === "open" && (
        <>
          <line x1={x1} y1={MID_Y} x2={x2} y2={MID_Y} strokeWidth={3} className="stroke-block-punishable" />
          <line
            x1={x1 + 4}
            y1={MID_Y - 5}
            x2={x1 + 4}
            y2={MID_Y + 5}
            strokeWidth={2}
            className="stroke-block-punishable"
          />
          <line
            x1={x2 - 4}
            y1={MID_Y - 5}
            x2={x2 - 4}
            y2={MID_Y + 5}
            strokeWidth={2}
            className="stroke-block-punishable"
          />
          <text
            x={cx}
            y={MID_Y - 9}
            textAnchor="middle"
            fontSize={TIMELINE_FONT.label}
            className="fill-block-punishable"
          >
            {seg.label}
          </text>
        </>
      )}
      {seg.status === "jail" && (
        <>
          {/* Bars across the join: the defender is held between the hits. */}
          <line x1={x1} y1={MID_Y} x2={x2} y2={MID_Y} strokeWidth={3} className="stroke-block-plus" />
          {[cx - 6, cx, cx + 6].map((bx) => (
            <line
              key={bx}
              x1={bx}
              y1={MID_Y - 6}
              x2={bx}
              y2={MID_Y + 6}
              strokeWidth={2}
              className="stroke-block-plus"
            />
          ))}
          <text x={cx} y={MID_Y - 10} textAnchor="middle" fontSize={TIMELINE_FONT.label} className="fill-block-plus">
            {seg.label}
          </text>
          <text x={cx} y={MID_Y + 18} textAnchor="middle" fontSize={TIMELINE_FONT.caption} className="fill-ink-300">
            {seg.frames}f
          </text>
        </>
      )}
      {seg.status === "unknown" && (
        <>
          <line
            x1={x1}
            y1={MID_Y}
            x2={x2}
            y2={MID_Y}
            strokeWidth={2}
            strokeDasharray="3 4"
            className="stroke-ink-400"
          />
          <text x={cx} y={MID_Y - 9} textAnchor="middle" fontSize={TIMELINE_FONT.label} className="fill-ink-300">
            {seg.label}
          </text>
        </>
      )}
    </Figure>
  );
}

function Cancel({ seg, onActive }: { seg: CancelSegment; onActive: (id: string, on: boolean) => void }) {
  const cx = seg.x + seg.width / 2;
  const saved = seg.framesSaved === null ? null : framesSavedLabel(seg.framesSaved);
  return (
    <Figure
      id={`cancel-${seg.after}`}
      label={`Cancel ${seg.input} into ${seg.stance} after hit ${seg.after + 1}${saved === null ? "" : `, ${saved}`}`}
      explain={seg.explain}
      box={{ x: seg.x + 1, y: 2, width: seg.width - 2, height: saved === null ? BOX_TOP + BOX_H : BELOW_Y + 4 }}
      onActive={onActive}
      data={{ "data-cancel-after": seg.after }}
    >
      <text x={cx} y={CAPTION_Y} textAnchor="middle" fontSize={TIMELINE_FONT.caption} className="fill-accent">
        cancel
      </text>
      {/* Rounded and dashed, as the graph draws a stance. */}
      <rect
        x={seg.x + 6}
        y={BOX_TOP}
        width={seg.width - 12}
        height={BOX_H}
        rx={14}
        strokeWidth={2}
        strokeDasharray="6 4"
        className="fill-ink-900 stroke-accent"
      />
      <text x={cx} y={FIGURE_Y} textAnchor="middle" fontSize={TIMELINE_FONT.figure} className="fill-ink-100">
        {seg.input}
      </text>
      <text x={cx} y={WORD_Y} textAnchor="middle" fontSize={TIMELINE_FONT.caption} className="fill-ink-300">
        {seg.stance}
      </text>
      {saved !== null && (
        <text x={cx} y={BELOW_Y} textAnchor="middle" fontSize={TIMELINE_FONT.label} className="fill-accent">
          {saved}
        </text>
      )}
    </Figure>
  );
}

function Start({ seg, onActive }: { seg: StartSegment; onActive: (id: string, on: boolean) => void }) {
  return (
    <Figure
      id="start"
      label={`Starts in ${seg.stance}`}
      explain={seg.explain}
      box={{ x: seg.x + 1, y: BOX_TOP, width: seg.width - 2, height: BOX_H }}
      onActive={onActive}
    >
      <rect
        x={seg.x + 4}
        y={BOX_TOP}
        width={seg.width - 8}
        height={BOX_H}
        rx={14}
        strokeWidth={2}
        strokeDasharray="6 4"
        className="fill-ink-900 stroke-ink-600"
      />
      <text
        x={seg.x + seg.width / 2}
        y={MID_Y + 4}
        textAnchor="middle"
        fontSize={TIMELINE_FONT.label}
        className="fill-ink-300"
      >
        from {seg.stance}
      </text>
    </Figure>
  );
}

function End({
  seg,
  cancel,
  rules,
  onActive,
}: {
  seg: EndSegment;
  cancel: CancelSegment | null;
  rules: BlockRules;
  onActive: (id: string, on: boolean) => void;
}) {
  const x = seg.x + 12;
  const width = seg.width - 12;
  const block = formatOutcome(seg.onBlock);
  const row = (id: string, y: number, word: string, value: string, explain: string) => (
    <Figure
      id={id}
      label={`${word} ${value}`}
      explain={explain}
      box={{ x: x - 3, y: y - 13, width: width + 2, height: 18 }}
      onActive={onActive}
      data={{ "data-outcome": id }}
    >
      <text x={x + 4} y={y} fontSize={TIMELINE_FONT.label}>
        <tspan className="fill-ink-400">{word} </tspan>
        <tspan className="fill-ink-100">{value}</tspan>
      </text>
    </Figure>
  );
  return (
    <>
      <Figure
        id="end-block"
        label={`On block ${block}${seg.blockClass === "state" ? "" : ` ${seg.blockWord}`}`}
        explain={explainEnd(seg, cancel, rules)}
        box={{ x: x - 3, y: 2, width: seg.boxWidth + 2, height: BOX_TOP + BOX_H }}
        onActive={onActive}
        data={{ "data-outcome": "on-block", "data-block-class": seg.blockClass }}
      >
        <text x={x + 4} y={CAPTION_Y} fontSize={TIMELINE_FONT.caption} className="fill-ink-400">
          on block
        </text>
        <rect
          x={x}
          y={BOX_TOP}
          width={seg.boxWidth - 4}
          height={BOX_H}
          rx={4}
          strokeWidth={2}
          className={`fill-ink-850 ${BLOCK_STROKE[seg.blockClass]}`}
        />
        <text x={x + 8} y={FIGURE_Y} fontSize={TIMELINE_FONT.figure} className="fill-ink-100">
          {block}
        </text>
        <text x={x + 8} y={WORD_Y} fontSize={TIMELINE_FONT.label} className={BLOCK_TEXT[seg.blockClass]}>
          {seg.blockWord}
        </text>
      </Figure>
      {row("on-hit", ON_HIT_Y, "on hit", formatOutcome(seg.onHit), explainOutcome("hit", seg.onHit, seg))}
      {row(
        "on-counter-hit",
        ON_CH_Y,
        "on counter hit",
        formatOutcome(seg.onCounterHit),
        explainOutcome("counter hit", seg.onCounterHit, seg),
      )}
    </>
  );
}

/**
 * The selected path as a strip read left to right: each hit by level, the gap on block
 * between hits, a stance cancel, and the outcome at the end. Every figure explains itself
 * on hover and on keyboard focus; the line under the strip repeats the explanation, as a
 * native SVG tooltip does not show on focus.
 */
function FrameTimelineView(props: {
  path: PathResult;
  graph: MoveGraph;
  rules: { fastest: number; launchAt: number };
}): JSX.Element {
  const { path, graph, rules } = props;
  const [active, setActive] = useState<string | null>(null);
  const segments = timelineSegments(path, graph);
  const width = timelineWidth(segments);
  const onActive = (id: string, on: boolean) => setActive((cur) => (on ? id : cur === id ? null : cur));

  const explanations = new Map<string, string>();
  let finalCancel: CancelSegment | null = null;
  for (const seg of segments) {
    if (seg.kind === "hit") explanations.set(`hit-${seg.index}`, seg.explain);
    else if (seg.kind === "gap") explanations.set(`gap-${seg.after}`, seg.explain);
    else if (seg.kind === "cancel") {
      explanations.set(`cancel-${seg.after}`, seg.explain);
      if (seg.final) finalCancel = seg;
    } else if (seg.kind === "start") explanations.set("start", seg.explain);
    else {
      explanations.set("end-block", explainEnd(seg, finalCancel, rules));
      explanations.set("on-hit", explainOutcome("hit", seg.onHit, seg));
      explanations.set("on-counter-hit", explainOutcome("counter hit", seg.onCounterHit, seg));
    }
  }
  const caption = (active === null ? undefined : explanations.get(active)) ?? null;

  return (
    <figure className="space-y-1">
      <div className="overflow-x-auto">
        <svg
          data-testid="frame-timeline"
          role="group"
          aria-label={`Frame timeline of ${path.input}`}
          viewBox={`0 0 ${width} ${TIMELINE_HEIGHT}`}
          width="100%"
          height={TIMELINE_HEIGHT}
          // Never drawn smaller than 1 unit = 1 px, so the 10px text stays 10px on a phone: it scrolls instead.
          style={{ minWidth: width }}
          preserveAspectRatio="xMinYMid meet"
          className="block font-mono tabular-nums"
        >
          {/* The time axis the segments sit on, from the first box to the on-block box. */}
          <line
            x1={(segments[0]?.x ?? 0) + 4}
            y1={MID_Y}
            x2={(segments.at(-1)?.x ?? 0) + 12}
            y2={MID_Y}
            strokeWidth={1}
            className="stroke-ink-600"
          />
          {segments.map((seg) => {
            switch (seg.kind) {
              case "hit":
                return <Hit key={`hit-${seg.index}`} seg={seg} onActive={onActive} />;
              case "gap":
                return <Gap key={`gap-${seg.after}`} seg={seg} onActive={onActive} />;
              case "cancel":
                return <Cancel key={`cancel-${seg.after}`} seg={seg} onActive={onActive} />;
              case "start":
                return <Start key="start" seg={seg} onActive={onActive} />;
              case "end":
                return <End key="end" seg={seg} cancel={finalCancel} rules={rules} onActive={onActive} />;
            }
          })}
        </svg>
      </div>
      <figcaption aria-hidden className="min-h-8 text-xs text-ink-300">
        {caption ?? <span className="text-ink-400">Hover or focus (Tab) a figure to see where it comes from.</span>}
      </figcaption>
    </figure>
  );
}

/** Memoised: it re-renders when its path, graph or rules change, not with every render of the Explorer. */
export const FrameTimeline = memo(FrameTimelineView);
