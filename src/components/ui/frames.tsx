import { advantageSide, formatOutcome, type AdvantageSide, type Outcome } from "@/lib/engine";

const TONE: Record<AdvantageSide, string> = {
  attacker: "text-block-plus",
  even: "text-ink-300",
  defender: "text-ink-100",
  state: "text-block-state",
};

/** A frame outcome in monospace; negative numbers and states are tinted, and always written out. */
export function Frames({ value, title }: { value: Outcome | null; title?: string }) {
  if (value === null) return <span className="text-ink-600">—</span>;
  return (
    <span className={`font-mono tabular-nums ${TONE[advantageSide(value)]}`} title={title}>
      {formatOutcome(value)}
    </span>
  );
}
