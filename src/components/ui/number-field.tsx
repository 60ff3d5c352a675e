"use client";

import { useState, type ReactNode } from "react";
import { readDistance } from "@/lib/move-list";

const field = "rounded border border-ink-700 bg-ink-900 px-1.5 py-0.5 font-mono text-ink-100";

/**
 * The text of a number field that also follows its value from outside (Clear filters, the
 * browser's back button): what is typed stays as typed, even while it is not yet a number.
 */
export function useFollowedText(value: number | null): [string, (text: string) => void] {
  const [text, setText] = useState(value === null ? "" : String(value));
  const [seen, setSeen] = useState(value);
  if (seen !== value) {
    setSeen(value);
    setText(value === null ? "" : String(value));
  }
  return [text, setText];
}

/**
 * "Reaches at d": a distance in the game's unit of range, labelled, with the unit beside it.
 * `onChange` hears each readable distance, and null when the field is emptied.
 */
export function DistanceInput({
  label,
  title,
  unit,
  value,
  onChange,
  stacked = false,
}: {
  label: ReactNode;
  title?: string;
  unit: string | null;
  value: number | null;
  onChange: (d: number | null) => void;
  /** The label above the field (a filter form's row) rather than beside it. */
  stacked?: boolean;
}) {
  const [text, setText] = useFollowedText(value);
  return (
    <label className={stacked ? "flex flex-col gap-1" : "flex items-center gap-2 text-sm text-ink-200"}>
      <span className={stacked ? "text-xs text-ink-400" : undefined} title={title}>
        {label}
      </span>
      <span className="flex items-center gap-1">
        <input
          type="number"
          inputMode="decimal"
          min={0}
          max={999.99}
          step={0.1}
          value={text}
          onChange={(e) => {
            setText(e.target.value);
            const d = readDistance(e.target.value);
            if (e.target.value === "" || d !== null) onChange(d);
          }}
          className={`${field} w-20`}
        />
        <span className="text-ink-400">{unit}</span>
      </span>
    </label>
  );
}
