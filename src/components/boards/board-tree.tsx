"use client";

import "@xyflow/react/dist/style.css";
import { Background, Controls, Handle, Position, ReactFlow, type Edge, type Node, type NodeProps } from "@xyflow/react";
import { memo, useMemo } from "react";
import type { BoardDocument } from "@/lib/board";
import { formatPayoff, type BoardSolution } from "@/lib/engine";
import { layoutGraph } from "@/lib/layout-graph";

const SIZE = { width: 184, height: 56 };
const FIT_VIEW_OPTIONS = { padding: 0.2, maxZoom: 1 };
const PRO_OPTIONS = { hideAttribution: false };

type SituationNodeData = { name: string; value: number | null; root: boolean; selected: boolean };
type SituationFlowNode = Node<SituationNodeData, "situation">;

const SituationNode = memo(function SituationNode({ data }: NodeProps<SituationFlowNode>) {
  return (
    <div
      className={`flex h-14 w-46 flex-col justify-center rounded-md border px-2 text-left ${
        data.selected ? "border-accent bg-ink-800" : "border-ink-700 bg-ink-900"
      }`}
    >
      <Handle type="target" position={Position.Top} className="!opacity-0" />
      <span className="truncate text-xs text-ink-100">
        {data.root ? "▸ " : ""}
        {data.name}
      </span>
      <span className="font-mono text-sm text-accent">{data.value === null ? "–" : formatPayoff(data.value)}</span>
      <Handle type="source" position={Position.Bottom} className="!opacity-0" />
    </div>
  );
});

const nodeTypes = { situation: SituationNode };

/**
 * The board as a tree: situations as nodes with their value, a link for each cell that
 * leads on. Clicking a node opens its matrix; the situation list beside it does the same
 * from the keyboard.
 */
export function BoardTree({
  document,
  solution,
  selected,
  onSelect,
}: {
  document: BoardDocument;
  solution: BoardSolution | null;
  selected: string;
  onSelect: (id: string) => void;
}) {
  const shape = useMemo(() => {
    const links: Edge[] = [];
    for (const s of document.situations) {
      const seen = new Set<string>();
      s.cells.forEach((r, i) =>
        r.forEach((c, j) => {
          if (c.next === null || seen.has(c.next)) return;
          if (!document.situations.some((x) => x.id === c.next)) return;
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
    const placed = layoutGraph(
      document.situations.map((s) => ({ id: s.id, ...SIZE })),
      links.map((l) => ({ id: l.id, source: l.source, target: l.target })),
      "TB",
      { rankSep: 64, nodeSep: 32 },
    );
    return { links, placed };
  }, [document.situations]);

  const nodes: SituationFlowNode[] = useMemo(
    () =>
      shape.placed.map((p) => {
        const s = document.situations.find((x) => x.id === p.id)!;
        return {
          id: p.id,
          type: "situation",
          position: { x: p.x, y: p.y },
          data: {
            name: s.name,
            value: solution?.situations[s.id]?.value ?? null,
            root: s.id === document.root,
            selected: s.id === selected,
          },
          ariaLabel: `${s.name}: value ${solution ? formatPayoff(solution.situations[s.id]?.value ?? 0) : "not solved"}`,
          width: SIZE.width,
          height: SIZE.height,
        };
      }),
    [shape, document.situations, document.root, solution, selected],
  );

  return (
    <ReactFlow
      nodes={nodes}
      edges={shape.links}
      nodeTypes={nodeTypes}
      onNodeClick={(_, n) => onSelect(n.id)}
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
  );
}
