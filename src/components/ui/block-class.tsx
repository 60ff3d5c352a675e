import { classifyBlock, type BlockClass, type Outcome } from "@/lib/engine";
import { BLOCK_CLASS_WORD, formatOutcome } from "@/lib/format";

export { BLOCK_CLASS_WORD };

export const BLOCK_CLASS_STYLE: Record<BlockClass, string> = {
  plus: "text-block-plus",
  even: "text-block-even",
  safe: "text-block-safe",
  punishable: "text-block-punishable",
  "launch-punishable": "text-block-launch-punishable",
  state: "text-block-state",
};

export interface BlockRules {
  fastest: number;
  launchAt: number;
}

/** Why an ending has its class, in one sentence: what the hover says. */
export function explainBlock(onBlock: Outcome, rules: BlockRules): string {
  const cls = classifyBlock(onBlock, rules);
  const v = formatOutcome(onBlock);
  switch (cls) {
    case "plus":
      return `${v} on block: you act first (plus is +1 or more).`;
    case "even":
      return `${v} on block: both sides act at once.`;
    case "safe":
      return `${v} on block: safe, the opponent's fastest attack (${rules.fastest}f) does not reach you in time (safe is above -${rules.fastest}).`;
    case "punishable":
      return `${v} on block: punishable, any defender move of startup ${-Number(onBlock)}f or less lands (punishable from -${rules.fastest}).`;
    case "launch-punishable":
      return `${v} on block: a launching punish lands (from -${rules.launchAt}).`;
    case "state":
      return `On block: ${v}.`;
  }
}

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
