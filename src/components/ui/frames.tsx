import type { Outcome } from "@/lib/engine";
import { formatOutcome } from "@/lib/format";

/** A frame outcome in monospace; negative numbers and states are tinted, and always written out. */
export function Frames({ value, title }: { value: Outcome | null; title?: string }) {
  if (value === null) return <span className="text-ink-600">—</span>;
  const tone =
    typeof value !== "number"
      ? "text-block-state"
      : value > 0
        ? "text-block-plus"
        : value < 0
          ? "text-ink-100"
          : "text-ink-300";
  return (
    <span className={`font-mono tabular-nums ${tone}`} title={title}>
      {formatOutcome(value)}
    </span>
  );
}
