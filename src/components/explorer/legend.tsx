import { memo } from "react";
import { LevelBadge } from "@/components/ui/level-badge";
import { BLOCK_CLASS_STYLE } from "@/components/ui/block-class";
import {
  BLOCK_CLASS_WORD,
  LEVELS,
  blockClassMeaning,
  blockClassRange,
  type BlockClass,
  type BlockRules,
} from "@/lib/engine";

/** The classes a number on block can have, best first. */
const NUMBER_CLASSES: readonly BlockClass[] = ["plus", "even", "safe", "punishable", "launch-punishable"];

function Line({ dash, color, label }: { dash?: string; color: string; label: string }) {
  return (
    <li className="flex items-center gap-2">
      <svg width="36" height="8" aria-hidden>
        <line
          x1="0"
          y1="4"
          x2="36"
          y2="4"
          stroke={color}
          strokeWidth="2"
          strokeDasharray={dash}
          strokeLinecap="round"
        />
      </svg>
      {label}
    </li>
  );
}

/** A small node with the overlay's ring, as the graph draws it around a node. */
function RingMark({ label, ring }: { label: string; ring: "path" | "end" | "focus" }) {
  return (
    <li className="flex items-center gap-2">
      <svg width="36" height="16" aria-hidden>
        <rect x="6" y="4" width="24" height="8" rx="2" className="fill-ink-850 stroke-ink-700" strokeWidth="1" />
        {ring === "end" && (
          <rect x="3" y="1" width="30" height="14" rx="4" fill="none" className="stroke-accent/40" strokeWidth="3" />
        )}
        <rect
          x={ring === "focus" ? 1 : 3}
          y={ring === "focus" ? 1 : 2}
          width={ring === "focus" ? 34 : 30}
          height={ring === "focus" ? 14 : 12}
          rx="4"
          fill="none"
          strokeWidth="1.5"
          strokeDasharray={ring === "focus" ? "3 2" : undefined}
          className={ring === "path" ? "stroke-accent-muted" : ring === "end" ? "stroke-accent" : "stroke-ink-200"}
        />
      </svg>
      {label}
    </li>
  );
}

/** Every colour and line style of the graph, in words. Memoised: a selection does not re-render it, a rule change does. */
export const Legend = memo(function Legend({ rules }: { rules: BlockRules }) {
  return (
    <details className="rounded-lg border border-ink-800 bg-ink-900 px-3 py-2 text-xs text-ink-300" open>
      <summary className="cursor-pointer text-ink-400">Legend</summary>
      <div className="mt-2 grid gap-3 sm:grid-cols-3">
        <ul className="space-y-1">
          <Line color="#7d8aa3" label="follow-up: the next hit of the string" />
          <Line color="#f5c451" dash="6 4" label="stance cancel (label: input · frames saved)" />
          <Line color="#6fd0b4" dash="1 4" label="move done from the stance" />
          <Line color="#ffd873" label="the selected path" />
          <RingMark ring="path" label="ring: a move on the selected path" />
          <RingMark ring="end" label="bright ring: where the path ends" />
          <RingMark ring="focus" label="dashed ring: the keyboard's place" />
        </ul>
        <ul className="flex flex-wrap gap-1.5">
          {LEVELS.map((l) => (
            <li key={l}>
              <LevelBadge level={l} />
            </li>
          ))}
        </ul>
        <ul className="space-y-0.5">
          {NUMBER_CLASSES.map((cls) => (
            <li key={cls}>
              <span className={BLOCK_CLASS_STYLE[cls]}>{BLOCK_CLASS_WORD[cls]}</span>{" "}
              <span className="text-ink-400">
                ({blockClassRange(cls, rules)}) — {blockClassMeaning(cls, rules)}
              </span>
            </li>
          ))}
          <li>
            <span className="inline-block rounded-full border-2 border-dashed border-ink-600 px-2">
              rounded, dashed
            </span>{" "}
            <span className="text-ink-400">— a stance</span>
          </li>
        </ul>
      </div>
    </details>
  );
});
