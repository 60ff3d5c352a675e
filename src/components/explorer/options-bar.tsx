"use client";

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

export function OptionsBar({
  editions,
  edition,
  pathCount,
  truncated,
}: {
  editions: EditionRef[];
  edition: string;
  pathCount: number;
  truncated: boolean;
}) {
  const setEdition = useExplorerStore((s) => s.setEdition);
  const options = useExplorerStore((s) => s.options);
  const setOptionNow = useExplorerStore((s) => s.setOption);
  const setOption: typeof setOptionNow = (key, value) => {
    startTiming("recompute");
    setOptionNow(key, value);
  };
  return (
    <form className="flex flex-wrap items-center gap-x-5 gap-y-2 text-sm" onSubmit={(e) => e.preventDefault()} aria-label="Explorer options">
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
      <NumberField label="Depth" value={options.maxDepth} min={1} max={16} onChange={(v) => setOption("maxDepth", v)} hint="Most hits on one path" />
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
    </form>
  );
}
