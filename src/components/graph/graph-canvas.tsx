"use client";

import "@xyflow/react/dist/style.css";
import { Background, Controls, MarkerType, MiniMap, ReactFlow, type Edge } from "@xyflow/react";
import { useEffect, useMemo, useState, type KeyboardEvent } from "react";
import { ExportButton } from "./export-button";
import type { BlockRules } from "@/components/ui/block-class";
import type { MoveGraph, PathResult } from "@/lib/engine";
import { layoutGraph } from "@/lib/layout-graph";
import { MOVE_SIZE, RulesContext, STANCE_SIZE, createRulesStore, nodeTypes, type MoveFlowNode, type StanceFlowNode } from "./nodes";

export const EDGE_STYLE = {
  follow: { stroke: "#7d8aa3", strokeWidth: 1.5 },
  cancel: { stroke: "#f5c451", strokeWidth: 1.5, strokeDasharray: "6 4" },
  enter: { stroke: "#6fd0b4", strokeWidth: 1.5, strokeDasharray: "1 4", strokeLinecap: "round" as const },
};

/** The frames a cancel saves over stopping at the hit it ends, when both are numbers. */
export function cancelSaves(graph: MoveGraph, edge: MoveGraph["edges"][number]): number | null {
  if (edge.kind !== "cancel" || typeof edge.onBlock !== "number") return null;
  const from = graph.nodes.find((n) => n.id === edge.from);
  return from?.kind === "move" && typeof from.onBlock === "number" ? edge.onBlock - from.onBlock : null;
}

export function GraphCanvas({
  graph,
  rules,
  selected,
  onSelectNode,
  onClear,
  exportName,
}: {
  graph: MoveGraph;
  rules: BlockRules;
  selected: PathResult | null;
  onSelectNode: (nodeId: string) => void;
  onClear: () => void;
  /** File name of the PNG export. */
  exportName: string;
}) {
  const layout = useMemo(() => {
    // Timing only (npm run bench:ui): reading the clock does not change what renders.
    // eslint-disable-next-line react-hooks/purity
    const started = performance.now();
    const placed = layoutGraph(
      graph.nodes.map((n) => ({ id: n.id, ...(n.kind === "move" ? MOVE_SIZE : STANCE_SIZE) })),
      graph.edges.map((e) => ({ id: e.id, source: e.from, target: e.to })),
      "LR",
      // Room between columns for a cancel's label (input · frames saved).
      { rankSep: 120, nodeSep: 28 },
    );
    // eslint-disable-next-line react-hooks/purity
    performance.measure("framefork:layout", { start: started, end: performance.now() });
    return new Map(placed.map((p) => [p.id, p]));
  }, [graph]);

  const [rulesStore] = useState(() => createRulesStore(rules));
  useEffect(() => rulesStore.setState(rules, true), [rulesStore, rules]);

  const [focused, setFocused] = useState<string | null>(null);
  const current = focused ?? selected?.nodes[selected.nodes.length - 1] ?? graph.nodes[0]?.id ?? null;
  const onKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    if (current === null) return;
    if (event.key === "Enter" || event.key === " ") {
      event.preventDefault();
      onSelectNode(current);
      return;
    }
    if (event.key === "Escape") {
      onClear();
      return;
    }
    const next = stepFocus(graph, layout, current, event.key, selected);
    if (next !== null) {
      event.preventDefault();
      setFocused(next);
    }
  };

  const onPathNodes = useMemo(() => new Set(selected?.nodes ?? []), [selected]);
  const onPathEdges = useMemo(() => new Set(selected?.edges ?? []), [selected]);
  const endNode = selected ? selected.nodes[selected.nodes.length - 1] : undefined;

  // Base objects keep their identity across selections, so React Flow re-renders only the
  // few nodes and edges whose marks change, not all of them.
  const baseNodes = useMemo(
    () =>
      graph.nodes.map((n): MoveFlowNode | StanceFlowNode => {
        const p = layout.get(n.id)!;
        const marks = { onPath: false, isEnd: false, hasFocus: false };
        const common = { id: n.id, position: { x: p.x, y: p.y }, width: p.width, height: p.height, connectable: false, draggable: false };
        return n.kind === "move"
          ? { ...common, type: "move", data: { move: n, ...marks }, ariaLabel: `${n.input}, ${n.level}` }
          : { ...common, type: "stance", data: { stance: n, ...marks }, ariaLabel: `stance ${n.name}` };
      }),
    [graph, layout],
  );
  const nodes = useMemo(
    () =>
      baseNodes.map((n) => {
        const marks = { onPath: onPathNodes.has(n.id), isEnd: n.id === endNode, hasFocus: n.id === current };
        if (!marks.onPath && !marks.isEnd && !marks.hasFocus) return n;
        return { ...n, data: { ...n.data, ...marks } } as MoveFlowNode | StanceFlowNode;
      }),
    [baseNodes, onPathNodes, endNode, current],
  );

  const baseEdges = useMemo(
    () =>
      graph.edges.map((e): Edge => {
        const base = EDGE_STYLE[e.kind];
        const saves = cancelSaves(graph, e);
        return {
          id: e.id,
          source: e.from,
          target: e.to,
          type: e.kind === "follow" ? "default" : "smoothstep",
          style: base,
          markerEnd: { type: MarkerType.ArrowClosed, color: base.stroke, width: 16, height: 16 },
          // Follow-ups need no label (the next node shows its whole input); a cancel's says what it saves.
          label: e.kind === "cancel" ? `${e.input}${saves === null ? "" : ` · ${saves >= 0 ? "saves" : "costs"} ${Math.abs(saves)}f`}` : e.kind === "enter" ? e.input : undefined,
          labelStyle: { fill: "#cfd6e4", fontFamily: '"JetBrains Mono", monospace', fontSize: 11 },
          labelBgStyle: { fill: "#11141b" },
          labelBgPadding: [4, 2],
          focusable: false,
          zIndex: 0,
        };
      }),
    [graph],
  );
  const edges = useMemo(
    () =>
      baseEdges.map((e) =>
        onPathEdges.has(e.id)
          ? {
              ...e,
              style: { ...e.style, stroke: "#ffd873", strokeWidth: 3 },
              markerEnd: { type: MarkerType.ArrowClosed, color: "#ffd873", width: 16, height: 16 },
              // Same zIndex as the rest: React Flow draws each zIndex in its own layer, so raising
              // an edge would remount it (and measure its label again) on every selection.
            }
          : e,
      ),
    [baseEdges, onPathEdges],
  );

  const focusedNode = graph.nodes.find((n) => n.id === current);
  return (
    <RulesContext value={rulesStore}>
      <div
        className="h-full w-full outline-none focus-visible:ring-2 focus-visible:ring-accent"
        tabIndex={0}
        role="group"
        aria-label="Move graph. Arrow keys move between moves, Enter selects the path, Escape clears."
        aria-describedby="graph-focus"
        onKeyDown={onKeyDown}
      >
        <span id="graph-focus" className="sr-only" aria-live="polite">
          {focusedNode ? (focusedNode.kind === "move" ? `${focusedNode.input}, ${focusedNode.level}` : `stance ${focusedNode.name}`) : ""}
        </span>
        <ReactFlow
          nodes={nodes}
          edges={edges}
          nodeTypes={nodeTypes}
          colorMode="dark"
          fitView
          fitViewOptions={{ padding: 0.15 }}
          minZoom={0.2}
          nodesDraggable={false}
          nodesConnectable={false}
          elementsSelectable={false}
          onNodeClick={(_, node) => onSelectNode(node.id)}
          proOptions={{ hideAttribution: false }}
        >
          <Background color="#283040" gap={24} />
          <Controls showInteractive={false} position="bottom-left" />
          <ExportButton fileName={exportName} />
          {graph.nodes.length > 24 && <MiniMap pannable zoomable position="bottom-right" nodeColor="#3a4458" maskColor="rgba(11,13,18,0.7)" />}
        </ReactFlow>
      </div>
    </RulesContext>
  );
}

/**
 * Keyboard moves through the graph: right to the first next step, left back
 * to where this node was reached from (along the selected path when it is on
 * it), up and down across the siblings that share that parent.
 */
export function stepFocus(
  graph: MoveGraph,
  layout: Map<string, { y: number }>,
  current: string,
  key: string,
  selected: PathResult | null,
): string | null {
  const out = (id: string) => graph.edges.filter((e) => e.from === id).map((e) => e.to);
  const parentOf = (id: string) => {
    const i = selected?.nodes.indexOf(id) ?? -1;
    if (selected && i > 0) return selected.nodes[i - 1]!;
    return graph.edges.find((e) => e.to === id && e.from !== id)?.from ?? null;
  };
  const byY = (ids: string[]) => [...new Set(ids)].sort((a, b) => (layout.get(a)?.y ?? 0) - (layout.get(b)?.y ?? 0));
  switch (key) {
    case "ArrowRight":
      return byY(out(current).filter((t) => t !== current))[0] ?? null;
    case "ArrowLeft":
      return parentOf(current);
    case "ArrowUp":
    case "ArrowDown": {
      const parent = parentOf(current);
      if (parent === null) return null;
      const siblings = byY(out(parent).filter((t) => t !== parent));
      const i = siblings.indexOf(current);
      const j = key === "ArrowUp" ? i - 1 : i + 1;
      return siblings[j] ?? null;
    }
    default:
      return null;
  }
}
