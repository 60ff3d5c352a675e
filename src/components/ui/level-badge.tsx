import type { Level } from "@/lib/engine";

const LEVEL_STYLE: Record<Level, string> = {
  high: "border-level-high text-level-high",
  mid: "border-level-mid text-level-mid",
  low: "border-level-low text-level-low",
  "special-mid": "border-level-special-mid text-level-special-mid",
  throw: "border-level-throw text-level-throw",
  unblockable: "border-level-unblockable text-level-unblockable",
};

/** A hit level as a word in its colour: the colour never stands alone. */
export function LevelBadge({ level }: { level: Level }) {
  return (
    <span data-level={level} className={`level-badge ${LEVEL_STYLE[level]}`}>
      {level}
    </span>
  );
}
