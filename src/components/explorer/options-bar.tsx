"use client";

import Link from "next/link";
import { memo, type ReactNode } from "react";
import { useExplorerStore } from "@/components/providers/explorer-store-provider";
import type { EditionRef } from "@/lib/explorer";
import { startTiming } from "@/lib/timing";

function NumberField({
  label,
  value,
  min,
  max,
  onChange,
  hint,
}: {
  label: string;
  value: number;
  min: number;
  max: number;
  onChange: (v: number) => void;
  hint: string;
}) {
  return (
    <label className="flex items-center gap-2" title={hint}>
      <span className="text-ink-400">{label}</span>
      <input
        type="number"
        inputMode="numeric"
        min={min}
        max={max}
        value={value}
        onChange={(e) => {
          const v = Number(e.target.value);
          if (Number.isInteger(v) && v >= min && v <= max) onChange(v);
        }}
        className="w-14 rounded border border-ink-700 bg-ink-900 px-1.5 py-0.5 font-mono text-ink-100"
      />
    </label>
  );
}

/** Memoised: a selection changes none of its props. */
export const OptionsBar = memo(function OptionsBar({
  editions,
  edition,
  pathCount,
  truncated,
  pinnedTo,
  actions,
}: {
  editions: EditionRef[];
  edition: string;
  pathCount: number;
  truncated: boolean;
  /** A permalink's view: the Edition is shown, not switched, and the live Explorer is a link away. */
  pinnedTo?: { editionName: string; liveHref: string };
  /** Buttons at the end of the bar (Share). */
  actions?: ReactNode;
}) {
  const setEdition = useExplorerStore((s) => s.setEdition);
  const options = useExplorerStore((s) => s.options);
  const setOptionNow = useExplorerStore((s) => s.setOption);
  const setOption: typeof setOptionNow = (key, value) => {
    startTiming("recompute");
    setOptionNow(key, value);
  };
  return (
    <form
      className="flex flex-wrap items-center gap-x-5 gap-y-2 text-sm"
      onSubmit={(e) => e.preventDefault()}
      aria-label="Explorer options"
    >
      {pinnedTo ? (
        <span className="flex items-center gap-2" data-testid="pinned-edition">
          <span className="text-ink-400">Pinned to edition</span>
          <span className="font-mono text-ink-100">{pinnedTo.editionName}</span>
        </span>
      ) : (
        <label className="flex items-center gap-2">
          <span className="text-ink-400">Edition</span>
          <select
            value={edition}
            onChange={(e) => {
              startTiming("recompute");
              setEdition(e.target.value);
            }}
            className="rounded border border-ink-700 bg-ink-900 px-1.5 py-0.5 text-ink-100"
          >
            {editions.map((e) => (
              <option key={e.id} value={e.slug}>
                {e.name}
              </option>
            ))}
          </select>
        </label>
      )}
      <NumberField
        label="Depth"
        value={options.maxDepth}
        min={1}
        max={16}
        onChange={(v) => setOption("maxDepth", v)}
        hint="Most hits on one path"
      />
      <NumberField
        label="Stance re-entries"
        value={options.maxStanceVisits}
        min={0}
        max={4}
        onChange={(v) => setOption("maxStanceVisits", v)}
        hint="How often one path may enter the same stance"
      />
      <NumberField
        label="Opponent's fastest"
        value={options.fastest}
        min={1}
        max={30}
        onChange={(v) => setOption("fastest", v)}
        hint="Startup of the opponent's fastest attack, in frames: it decides safe and punishable"
      />
      <span className="text-ink-400" aria-live="polite">
        {pathCount} paths{truncated ? " (cut: too many to show)" : ""}
      </span>
      {pinnedTo ? (
        <Link
          href={pinnedTo.liveHref}
          className="text-accent underline underline-offset-2 focus-visible:outline-2 focus-visible:outline-accent"
        >
          Open in the live Explorer
        </Link>
      ) : null}
      {actions ? <span className="ml-auto flex items-center gap-2">{actions}</span> : null}
    </form>
  );
});
