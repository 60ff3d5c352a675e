"use client";

import { Handle, Position, type Node, type NodeProps } from "@xyflow/react";
import { createContext, memo, useCallback, useContext, useSyncExternalStore } from "react";
import { BLOCK_CLASS_STYLE, BLOCK_CLASS_WORD } from "@/components/ui/block-class";
import { Frames } from "@/components/ui/frames";
import { LevelBadge } from "@/components/ui/level-badge";
import { classifyBlock, type MoveNode as EngineMove, type StanceNode as EngineStance } from "@/lib/engine";
import type { CanvasMarks, CanvasStore } from "./canvas-store";

export const MOVE_SIZE = { width: 176, height: 64 };
export const STANCE_SIZE = { width: 168, height: 44 };

// Type aliases, not interfaces: React Flow's node data must be indexable.
export type MoveFlowNode = Node<{ move: EngineMove }, "move">;
export type StanceFlowNode = Node<{ stance: EngineStance }, "stance">;

export const CanvasContext = createContext<CanvasStore | null>(null);

/**
 * The part of the canvas marks that node or edge `id` draws. `select` must
 * return a primitive, so an unchanged result re-renders nothing.
 */
export function useCanvas<T extends string | number | boolean>(id: string, select: (marks: CanvasMarks) => T): T {
  const store = useContext(CanvasContext);
  if (!store) throw new Error("Graph nodes and edges need a CanvasContext provider");
  const subscribe = useCallback((listener: () => void) => store.subscribe(id, listener), [store, id]);
  const snapshot = () => select(store.getState());
  return useSyncExternalStore(subscribe, snapshot, snapshot);
}

const ON_PATH = 1;
const IS_END = 2;
const HAS_FOCUS = 4;
/** One number per node, so a node re-renders only when its own marks change. */
const marksOf = (m: CanvasMarks, id: string) => (m.pathNodes.has(id) ? ON_PATH : 0) | (m.end === id ? IS_END : 0) | (m.focus === id ? HAS_FOCUS : 0);

const ring = (bits: number) =>
  `${bits & IS_END ? "border-accent ring-2 ring-accent/50" : bits & ON_PATH ? "border-accent-muted" : "border-ink-700"} ${
    bits & HAS_FOCUS ? "outline-2 outline-offset-2 outline-dashed outline-ink-200" : ""
  }`;

function MoveNodeView({ data }: NodeProps<MoveFlowNode>) {
  const { move } = data;
  const bits = useCanvas(move.id, (m) => marksOf(m, move.id));
  const cls = useCanvas(move.id, (rules) => classifyBlock(move.onBlock, rules));
  return (
    <div
      data-node-id={move.id}
      data-on-path={bits & ON_PATH ? true : undefined}
      data-focus={bits & HAS_FOCUS ? true : undefined}
      className={`flex h-full w-full flex-col justify-between rounded-md border bg-ink-900 px-2 py-1.5 text-left ${ring(bits)}`}
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
  const bits = useCanvas(data.stance.id, (m) => marksOf(m, data.stance.id));
  return (
    <div
      data-node-id={data.stance.id}
      data-on-path={bits & ON_PATH ? true : undefined}
      data-focus={bits & HAS_FOCUS ? true : undefined}
      className={`flex h-full w-full items-center justify-center rounded-full border-2 border-dashed bg-ink-850 px-3 text-sm ${ring(bits)}`}
    >
      <Handle type="target" position={Position.Left} className="!h-2 !w-2 !border-0 !bg-ink-600" />
      <span className="text-[10px] uppercase tracking-wider text-ink-400">stance&nbsp;</span>
      <span className="truncate text-ink-100">{data.stance.name}</span>
      <Handle type="source" position={Position.Right} className="!h-2 !w-2 !border-0 !bg-ink-600" />
    </div>
  );
}

export const nodeTypes = { move: memo(MoveNodeView), stance: memo(StanceNodeView) };
