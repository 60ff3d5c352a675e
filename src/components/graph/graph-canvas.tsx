"use client";

import "@xyflow/react/dist/style.css";
import { Background, Controls, MiniMap, ReactFlow, ViewportPortal, type ReactFlowInstance } from "@xyflow/react";
import { useCallback, useLayoutEffect, useMemo, useRef, useState, type KeyboardEvent } from "react";
import { ExportButton } from "./export-button";
import type { BlockRules } from "@/components/ui/block-class";
import { framesSaved, framesSavedLabel, type MoveGraph, type PathResult } from "@/lib/engine";
import { boundsOf, canvasHeight, initialViewport } from "@/lib/graph-view";
import { layoutGraph } from "@/lib/layout-graph";
import { ArrowDefs, PathOverlay, edgeTypes, type MoveFlowEdge, type NodeBox } from "./edges";
import { CanvasStoreProvider } from "@/components/providers/canvas-store-provider";
import type { CanvasMarks } from "@/stores/canvas-store";
import { MOVE_SIZE, STANCE_SIZE, nodeTypes, type MoveFlowNode, type StanceFlowNode } from "./nodes";

/** The frames a cancel saves over stopping at the hit it ends, when both are numbers. */
export function cancelSaves(graph: MoveGraph, edge: MoveGraph["edges"][number]): number | null {
  if (edge.kind !== "cancel") return null;
  const from = graph.nodes.find((n) => n.id === edge.from);
  return from?.kind === "move" ? framesSaved(edge.onBlock, from.onBlock) : null;
}

// Props React Flow compares by identity: one object for the life of the page.
const PRO_OPTIONS = { hideAttribution: false };

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

  // One click handler for the life of the canvas: a new one would re-render every node.
  const selectRef = useRef(onSelectNode);
  useLayoutEffect(() => {
    selectRef.current = onSelectNode;
  }, [onSelectNode]);
  const onNodeClick = useCallback((_: unknown, node: { id: string }) => selectRef.current(node.id), []);

  // The first view: readable text, the whole width when it fits, else the part around the
  // selected path's end (or the root), and a canvas as tall as the graph up to the screen.
  const bounds = useMemo(() => boundsOf(layout.values()), [layout]);
  const canvas = useRef<HTMLDivElement>(null);
  const firstFocus = useRef(selected?.nodes[selected.nodes.length - 1] ?? graph.nodes[0]?.id ?? null);
  // The graph stays hidden until it sits at its first view, so nothing jumps under a finger
  // (or a test's click) between the first paint and the move to that view.
  const [placed, setPlaced] = useState(false);
  const onInit = useCallback(
    (flow: ReactFlowInstance<MoveFlowNode | StanceFlowNode, MoveFlowEdge>) => {
      const box = canvas.current;
      if (!box) return;
      const focus = firstFocus.current === null ? null : (layout.get(firstFocus.current) ?? null);
      void flow
        .setViewport(initialViewport(bounds, { width: box.clientWidth, height: box.clientHeight }, focus))
        .then(() => setPlaced(true));
    },
    [layout, bounds],
  );

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

  // The rules reach the nodes, and the selection the path overlay, through the canvas store; the
  // node and edge objects below depend on the graph alone, so React Flow never re-measures on a click.
  const marks = useMemo(
    (): CanvasMarks => ({
      fastest: rules.fastest,
      launchAt: rules.launchAt,
      pathNodes: new Set(selected?.nodes ?? []),
      pathEdges: new Set(selected?.edges ?? []),
      end: selected ? (selected.nodes[selected.nodes.length - 1] ?? null) : null,
      focus: current,
    }),
    [rules.fastest, rules.launchAt, selected, current],
  );

  const boxes = useMemo(
    () =>
      new Map<string, NodeBox>(graph.nodes.map((n) => [n.id, { ...layout.get(n.id)!, round: n.kind === "stance" }])),
    [graph, layout],
  );

  const nodes = useMemo(
    () =>
      graph.nodes.map((n): MoveFlowNode | StanceFlowNode => {
        const p = layout.get(n.id)!;
        // z-index 1: above the selected path's overlay, which lies over the edges (z-index 0).
        const common = {
          id: n.id,
          position: { x: p.x, y: p.y },
          width: p.width,
          height: p.height,
          zIndex: 1,
          connectable: false,
          draggable: false,
        };
        return n.kind === "move"
          ? { ...common, type: "move", data: { move: n }, ariaLabel: `${n.input}, ${n.level}` }
          : { ...common, type: "stance", data: { stance: n }, ariaLabel: `stance ${n.name}` };
      }),
    [graph, layout],
  );

  const edges = useMemo(
    () =>
      graph.edges.map((e): MoveFlowEdge => {
        const saves = cancelSaves(graph, e);
        // Follow-ups need no label (the next node shows its whole input); a cancel's says what it saves.
        const label =
          e.kind === "cancel"
            ? `${e.input}${saves === null ? "" : ` · ${framesSavedLabel(saves)}`}`
            : e.kind === "enter"
              ? e.input
              : null;
        // Edges take no pointer events (the class beats React Flow's own stroke hit area).
        return {
          id: e.id,
          source: e.from,
          target: e.to,
          type: "move",
          data: { kind: e.kind, label },
          focusable: false,
          selectable: false,
          className: "!pointer-events-none",
        };
      }),
    [graph],
  );

  // The same element while the graph is the same: a click re-renders the canvas store's few
  // subscribers, not React Flow and its panels.
  const large = graph.nodes.length > 24;
  const flow = useMemo(
    () => (
      <ReactFlow
        nodes={nodes}
        edges={edges}
        nodeTypes={nodeTypes}
        edgeTypes={edgeTypes}
        colorMode="dark"
        onInit={onInit}
        minZoom={0.2}
        nodesDraggable={false}
        nodesConnectable={false}
        elementsSelectable={false}
        onNodeClick={onNodeClick}
        proOptions={PRO_OPTIONS}
      >
        {/* Inside the viewport, so the PNG export carries the arrowheads too. */}
        <ViewportPortal>
          <ArrowDefs />
          <PathOverlay boxes={boxes} />
        </ViewportPortal>
        <Background color="#283040" gap={24} />
        <Controls showInteractive={false} position="bottom-left" />
        <ExportButton fileName={exportName} />
        {large && (
          <MiniMap pannable zoomable position="bottom-right" nodeColor="#3a4458" maskColor="rgba(11,13,18,0.7)" />
        )}
      </ReactFlow>
    ),
    [nodes, edges, boxes, onNodeClick, onInit, exportName, large],
  );

  const focusedNode = graph.nodes.find((n) => n.id === current);
  return (
    <CanvasStoreProvider marks={marks}>
      <div
        ref={canvas}
        style={{ height: `min(75vh, ${canvasHeight(bounds)}px)` }}
        className={`w-full outline-none focus-visible:ring-2 focus-visible:ring-accent ${placed ? "" : "invisible"}`}
        tabIndex={0}
        role="group"
        aria-label="Move graph. Arrow keys move between moves, Enter selects the path, Escape clears."
        aria-describedby="graph-focus"
        onKeyDown={onKeyDown}
      >
        <span id="graph-focus" className="sr-only" aria-live="polite">
          {focusedNode
            ? focusedNode.kind === "move"
              ? `${focusedNode.input}, ${focusedNode.level}`
              : `stance ${focusedNode.name}`
            : ""}
        </span>
        {flow}
      </div>
    </CanvasStoreProvider>
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
