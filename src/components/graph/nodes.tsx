"use client";

import { Handle, Position, type Node, type NodeProps } from "@xyflow/react";
import { memo } from "react";
import { BLOCK_CLASS_STYLE, BLOCK_CLASS_WORD } from "@/components/ui/block-class";
import { Frames } from "@/components/ui/frames";
import { LevelBadge } from "@/components/ui/level-badge";
import { classifyBlock, type MoveNode as EngineMove, type StanceNode as EngineStance } from "@/lib/engine";
import { useCanvasStore } from "@/components/providers/canvas-store-provider";

export const MOVE_SIZE = { width: 200, height: 64 };
export const STANCE_SIZE = { width: 168, height: 44 };

// Type aliases, not interfaces: React Flow's node data must be indexable.
export type MoveFlowNode = Node<{ move: EngineMove }, "move">;
export type StanceFlowNode = Node<{ stance: EngineStance }, "stance">;

function MoveNodeView({ data }: NodeProps<MoveFlowNode>) {
  const { move } = data;
  // The rules only, as one string: a click changes no node's class, so it re-renders no node.
  // The selected path is not read here: the path overlay draws it over the nodes.
  const cls = useCanvasStore((s) => classifyBlock(move.onBlock, s));
  return (
    <div
      data-node-id={move.id}
      className="flex h-full w-full flex-col justify-between rounded-md border border-ink-700 bg-ink-900 px-2 py-1.5 text-left"
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
          <span data-block-class={cls} className={`ml-2 truncate ${BLOCK_CLASS_STYLE[cls]}`}>
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
      className="flex h-full w-full items-center justify-center rounded-full border-2 border-dashed border-ink-700 bg-ink-850 px-3 text-sm"
    >
      <Handle type="target" position={Position.Left} className="!h-2 !w-2 !border-0 !bg-ink-600" />
      <span className="text-xs tracking-wider text-ink-400 uppercase">stance&nbsp;</span>
      <span className="truncate text-ink-100">{data.stance.name}</span>
      <Handle type="source" position={Position.Right} className="!h-2 !w-2 !border-0 !bg-ink-600" />
    </div>
  );
}

export const nodeTypes = { move: memo(MoveNodeView), stance: memo(StanceNodeView) };
