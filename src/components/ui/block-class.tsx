import { BLOCK_CLASS_WORD, classifyBlock, type BlockClass, type BlockRules, type Outcome } from "@/lib/engine";

export type { BlockRules };
export { BLOCK_CLASS_WORD };

export const BLOCK_CLASS_STYLE: Record<BlockClass, string> = {
  plus: "text-block-plus",
  even: "text-block-even",
  safe: "text-block-safe",
  punishable: "text-block-punishable",
  "launch-punishable": "text-block-launch-punishable",
  state: "text-block-state",
};

/** The block class as a word in its colour, never the colour alone. */
export function BlockClassTag({ onBlock, rules }: { onBlock: Outcome; rules: BlockRules }) {
  const cls = classifyBlock(onBlock, rules);
  if (cls === "state") return null;
  return (
    <span data-block-class={cls} className={`ml-2 text-[11px] ${BLOCK_CLASS_STYLE[cls]}`}>
      {BLOCK_CLASS_WORD[cls]}
    </span>
  );
}
