"use client";

import "@xyflow/react/dist/style.css";
import { Background, Controls, Handle, Position, ReactFlow, type Edge, type Node, type NodeProps } from "@xyflow/react";
import { createContext, memo, useCallback, useContext, useMemo } from "react";
import { useBoardStore } from "@/components/providers/board-store-provider";
import type { BoardDocument } from "@/lib/board";
import { formatPayoff, type BoardSolution } from "@/lib/engine";
import { layoutGraph } from "@/lib/layout-graph";

const SIZE = { width: 184, height: 56 };
const FIT_VIEW_OPTIONS = { padding: 0.2, maxZoom: 1 };
const PRO_OPTIONS = { hideAttribution: false };

type SituationNodeData = { name: string; root: boolean };
type SituationFlowNode = Node<SituationNodeData, "situation">;

/**
 * The solution reaches the nodes through context, and the selection through the store: a typed
 * payoff re-renders the twenty small nodes, while React Flow's node objects (and so its own
 * bookkeeping) change only with the tree's shape.
 */
const SolutionContext = createContext<BoardSolution | null>(null);

const SituationNode = memo(function SituationNode({ id, data }: NodeProps<SituationFlowNode>) {
  const value = useContext(SolutionContext)?.situations[id]?.value ?? null;
  const selected = useBoardStore((s) => s.selected === id);
  return (
    <div
      className={`flex h-14 w-46 flex-col justify-center rounded-md border px-2 text-left ${
        selected ? "border-accent bg-ink-800" : "border-ink-700 bg-ink-900"
      }`}
    >
      <Handle type="target" position={Position.Top} className="!opacity-0" />
      <span className="truncate text-xs text-ink-100">
        {data.root ? "▸ " : ""}
        {data.name}
      </span>
      <span className="font-mono text-sm text-accent">{value === null ? "–" : formatPayoff(value)}</span>
      <Handle type="source" position={Position.Bottom} className="!opacity-0" />
    </div>
  );
});

const nodeTypes = { situation: SituationNode };

/** A link from each situation to each situation one of its cells leads to, named by the first such cell. */
function treeLinks(situations: BoardDocument["situations"]): Edge[] {
  const links: Edge[] = [];
  const ids = new Set(situations.map((s) => s.id));
  for (const s of situations) {
    const seen = new Set<string>();
    s.cells.forEach((r, i) =>
      r.forEach((c, j) => {
        if (c.next === null || seen.has(c.next) || !ids.has(c.next)) return;
        seen.add(c.next);
        links.push({
          id: `${s.id}>${c.next}`,
          source: s.id,
          target: c.next,
          label: `${s.rows[i]} × ${s.cols[j]}`,
          labelStyle: { fill: "#a5b0c5", fontSize: 11 },
          labelBgStyle: { fill: "#11141b" },
          style: { stroke: "#3a4458" },
        });
      }),
    );
  }
  return links;
}

/**
 * The board as a tree: situations as nodes with their value, a link for each cell that
 * leads on. Clicking a node opens its matrix; the situation list beside it does the same
 * from the keyboard.
 */
export function BoardTree({
  document,
  solution,
  onSelect,
}: {
  document: BoardDocument;
  solution: BoardSolution | null;
  onSelect: (id: string) => void;
}) {
  // Laid out again only when the tree's shape changes (a situation or a link added or removed,
  // a name changed), not on every typed payoff: dagre is the costly part of a re-render.
  const links = useMemo(() => treeLinks(document.situations), [document.situations]);
  const shapeKey = JSON.stringify([
    document.root,
    document.situations.map((s) => [s.id, s.name]),
    links.map((l) => [l.id, l.label]),
  ]);
  const shape = useMemo(
    () => {
      const placed = layoutGraph(
        document.situations.map((s) => ({ id: s.id, ...SIZE })),
        links.map((l) => ({ id: l.id, source: l.source, target: l.target })),
        "TB",
        { rankSep: 64, nodeSep: 32 },
      );
      const names = new Map(document.situations.map((s) => [s.id, s.name]));
      const nodes: SituationFlowNode[] = placed.map((p) => ({
        id: p.id,
        type: "situation",
        position: { x: p.x, y: p.y },
        data: { name: names.get(p.id)!, root: p.id === document.root },
        ariaLabel: names.get(p.id)!,
        width: SIZE.width,
        height: SIZE.height,
      }));
      return { links, nodes };
    },
    // The key stands for every input the layout and the nodes read; payoffs move no node.
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [shapeKey],
  );
  const onNodeClick = useCallback((_: unknown, n: { id: string }) => onSelect(n.id), [onSelect]);

  return (
    <SolutionContext.Provider value={solution}>
      <ReactFlow
        nodes={shape.nodes}
        edges={shape.links}
        nodeTypes={nodeTypes}
        onNodeClick={onNodeClick}
        nodesDraggable={false}
        nodesConnectable={false}
        fitView
        fitViewOptions={FIT_VIEW_OPTIONS}
        colorMode="dark"
        proOptions={PRO_OPTIONS}
      >
        <Background color="#283040" gap={24} />
        <Controls showInteractive={false} position="bottom-left" />
      </ReactFlow>
    </SolutionContext.Provider>
  );
}
