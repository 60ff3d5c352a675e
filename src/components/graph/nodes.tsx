"use client";

import { Handle, Position, type Node, type NodeProps } from "@xyflow/react";
import { createContext, memo, useContext } from "react";
import { createStore, useStore, type StoreApi } from "zustand";
import { BLOCK_CLASS_STYLE, BLOCK_CLASS_WORD, type BlockRules } from "@/components/ui/block-class";
import { Frames } from "@/components/ui/frames";
import { LevelBadge } from "@/components/ui/level-badge";
import { classifyBlock, type MoveNode as EngineMove, type StanceNode as EngineStance } from "@/lib/engine";

export const MOVE_SIZE = { width: 176, height: 64 };
export const STANCE_SIZE = { width: 168, height: 44 };

// Type aliases, not interfaces: React Flow's node data must be indexable.
type Marks = {
  onPath: boolean;
  isEnd: boolean;
  /** The keyboard's place in the graph. */
  hasFocus: boolean;
};

export type MoveFlowNode = Node<{ move: EngineMove } & Marks, "move">;

/**
 * The block rules the nodes are drawn with, in a store of their own rather
 * than in each node's data: when the opponent's fastest attack changes, only
 * the nodes whose block class changes re-render, not all of them.
 */
export type RulesStore = StoreApi<BlockRules>;
export const createRulesStore = (rules: BlockRules): RulesStore => createStore<BlockRules>()(() => rules);
export const RulesContext = createContext<RulesStore | null>(null);

function useBlockClass(move: EngineMove) {
  const store = useContext(RulesContext);
  if (!store) throw new Error("Move nodes need a RulesContext provider");
  return useStore(store, (rules) => classifyBlock(move.onBlock, rules));
}
export type StanceFlowNode = Node<{ stance: EngineStance } & Marks, "stance">;

const ring = (m: Marks) =>
  `${m.isEnd ? "border-accent ring-2 ring-accent/50" : m.onPath ? "border-accent-muted" : "border-ink-700"} ${
    m.hasFocus ? "outline-2 outline-offset-2 outline-dashed outline-ink-200" : ""
  }`;

function MoveNodeView({ data }: NodeProps<MoveFlowNode>) {
  const { move } = data;
  const cls = useBlockClass(move);
  return (
    <div
      data-node-id={move.id}
      data-on-path={data.onPath || undefined}
      data-focus={data.hasFocus || undefined}
      className={`flex h-full w-full flex-col justify-between rounded-md border bg-ink-900 px-2 py-1.5 text-left ${ring(data)}`}
      title={move.name}
    >
      <Handle type="target" position={Position.Left} className="!h-2 !w-2 !border-0 !bg-ink-600" />
      <div className="flex items-center justify-between gap-2">
        <span className="truncate font-mono text-sm text-ink-100">{move.input}</span>
        <LevelBadge level={move.level} />
      </div>
      <div className="flex items-center text-xs text-ink-400">
        <span className="mr-1">block</span>
        <Frames value={move.onBlock} />
        {cls !== "state" && (
          <span data-block-class={cls} className={`ml-2 text-[11px] ${BLOCK_CLASS_STYLE[cls]}`}>
            {BLOCK_CLASS_WORD[cls]}
          </span>
        )}
      </div>
      <Handle type="source" position={Position.Right} className="!h-2 !w-2 !border-0 !bg-ink-600" />
    </div>
  );
}

function StanceNodeView({ data }: NodeProps<StanceFlowNode>) {
  return (
    <div
      data-node-id={data.stance.id}
      data-on-path={data.onPath || undefined}
      data-focus={data.hasFocus || undefined}
      className={`flex h-full w-full items-center justify-center rounded-full border-2 border-dashed bg-ink-850 px-3 text-sm ${ring(data)}`}
    >
      <Handle type="target" position={Position.Left} className="!h-2 !w-2 !border-0 !bg-ink-600" />
      <span className="text-[10px] uppercase tracking-wider text-ink-400">stance&nbsp;</span>
      <span className="truncate text-ink-100">{data.stance.name}</span>
      <Handle type="source" position={Position.Right} className="!h-2 !w-2 !border-0 !bg-ink-600" />
    </div>
  );
}

export const nodeTypes = { move: memo(MoveNodeView), stance: memo(StanceNodeView) };
