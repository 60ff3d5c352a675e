"use client";

import {
  BaseEdge,
  EdgeLabelRenderer,
  getBezierPath,
  getSmoothStepPath,
  type Edge,
  type EdgeProps,
} from "@xyflow/react";
import { memo, useLayoutEffect } from "react";
import { useShallow } from "zustand/react/shallow";
import { useCanvasStore } from "@/components/providers/canvas-store-provider";
import type { MoveGraph } from "@/lib/engine";
import { selectOverlay } from "@/stores/canvas-store";

export const EDGE_STYLE = {
  follow: { stroke: "#7d8aa3", strokeWidth: 1.5 },
  cancel: { stroke: "#f5c451", strokeWidth: 1.5, strokeDasharray: "6 4" },
  enter: { stroke: "#6fd0b4", strokeWidth: 1.5, strokeDasharray: "1 4", strokeLinecap: "round" as const },
};
const PATH_STROKE = "#ffd873";

/** Arrowheads, drawn once for the canvas: one per edge kind and one for the selected path. */
export const ARROW_IDS = {
  follow: "ff-arrow-follow",
  cancel: "ff-arrow-cancel",
  enter: "ff-arrow-enter",
  path: "ff-arrow-path",
} as const;

export function ArrowDefs() {
  const arrows: [string, string][] = [
    [ARROW_IDS.follow, EDGE_STYLE.follow.stroke],
    [ARROW_IDS.cancel, EDGE_STYLE.cancel.stroke],
    [ARROW_IDS.enter, EDGE_STYLE.enter.stroke],
    [ARROW_IDS.path, PATH_STROKE],
  ];
  return (
    <svg aria-hidden="true" width="0" height="0" className="absolute">
      <defs>
        {arrows.map(([id, color]) => (
          <marker
            key={id}
            id={id}
            viewBox="-10 -10 20 20"
            markerWidth="16"
            markerHeight="16"
            orient="auto-start-reverse"
            refX="0"
            refY="0"
            markerUnits="userSpaceOnUse"
          >
            <polyline
              points="-5,-4 0,0 -5,4 -5,-4"
              fill={color}
              stroke={color}
              strokeLinejoin="round"
              strokeLinecap="round"
              strokeWidth="1"
            />
          </marker>
        ))}
      </defs>
    </svg>
  );
}

// A type alias, not an interface: React Flow's edge data must be indexable.
type EdgeKind = MoveGraph["edges"][number]["kind"];
export type MoveFlowEdge = Edge<{ kind: EdgeKind; label: string | null }, "move">;

/**
 * Every edge of the graph. Follow edges curve, cancel and enter edges step;
 * labels are HTML, so drawing one never measures SVG text. An edge is drawn
 * once and never restyled: it records in the canvas store where it was drawn,
 * and {@link PathOverlay} draws the selected path over it from that record.
 */
function MoveEdgeView({
  id,
  data,
  sourceX,
  sourceY,
  targetX,
  targetY,
  sourcePosition,
  targetPosition,
}: EdgeProps<MoveFlowEdge>) {
  const setDrawnEdge = useCanvasStore((s) => s.setDrawnEdge);
  const kind = data?.kind ?? "follow";
  const text = data?.label ?? null;
  const geometry = { sourceX, sourceY, targetX, targetY, sourcePosition, targetPosition };
  const [path, labelX, labelY] = kind === "follow" ? getBezierPath(geometry) : getSmoothStepPath(geometry);
  useLayoutEffect(() => {
    setDrawnEdge(id, { d: path, kind, label: text === null ? null : { text, x: labelX, y: labelY } });
    return () => setDrawnEdge(id, null);
  }, [setDrawnEdge, id, path, kind, text, labelX, labelY]);
  return (
    <>
      {/* No wide invisible stroke to catch the pointer: edges take no clicks, and the browser
          hit-tests the pointer against every one after each layout under the cursor. */}
      <BaseEdge
        id={id}
        path={path}
        style={EDGE_STYLE[kind]}
        interactionWidth={0}
        markerEnd={`url(#${ARROW_IDS[kind]})`}
      />
      {text && (
        <EdgeLabelRenderer>
          <EdgeLabel id={id} text={text} x={labelX} y={labelY} />
        </EdgeLabelRenderer>
      )}
    </>
  );
}

/**
 * A cancel's or an entry's label, centred on its edge, above the path overlay's edges (z-index 1),
 * so the path runs under it. The path's own copy sits at z-index 2, over the graph's label
 * whichever of the two was added to the page last.
 */
function EdgeLabel({
  id,
  text,
  x,
  y,
  onPath = false,
}: {
  id: string;
  text: string;
  x: number;
  y: number;
  onPath?: boolean;
}) {
  return (
    <div
      data-edge-label={onPath ? undefined : id}
      data-path-label={onPath ? id : undefined}
      style={{ transform: `translate(-50%, -50%) translate(${x}px, ${y}px)` }}
      className={`pointer-events-none absolute rounded bg-ink-950 px-1 py-px font-mono text-xs ${onPath ? "z-[2] text-accent" : "z-[1] text-ink-200"}`}
    >
      {text}
    </div>
  );
}

/** Where a node sits on the canvas, in the graph's units, and whether it is drawn round (a stance). */
export interface NodeBox {
  x: number;
  y: number;
  width: number;
  height: number;
  round: boolean;
}

/** A rounded rectangle `offset` px outside a node's box, in the node's own shape. */
function Ring({
  box,
  offset,
  className,
  ...rest
}: { box: NodeBox; offset: number; className: string } & React.SVGProps<SVGRectElement>) {
  const radius = box.round ? box.height / 2 + offset : 6 + offset;
  return (
    <rect
      x={box.x - offset}
      y={box.y - offset}
      width={box.width + 2 * offset}
      height={box.height + 2 * offset}
      rx={radius}
      fill="none"
      className={className}
      {...rest}
    />
  );
}

/**
 * The selected path, drawn over the graph: its edges again in the path's
 * colour (over the graph's edges, under its nodes, which sit at z-index 1),
 * its labels in the path's colour, a ring around each of its nodes (a wider
 * one at its end), and a dashed ring at the keyboard's place. One component
 * that re-renders on a click, in place of every node and edge the path enters
 * or leaves. Rendered inside the viewport (a `ViewportPortal`), in the graph's
 * units, so it pans, zooms and exports with the graph.
 */
export function PathOverlay({ boxes }: { boxes: ReadonlyMap<string, NodeBox> }) {
  const { pathNodes, pathEdges, end, focus, drawnEdge } = useCanvasStore(useShallow(selectOverlay));
  const edges = [...pathEdges].flatMap((id) => {
    const drawn = drawnEdge(id);
    return drawn ? [{ id, ...drawn }] : [];
  });
  const ring = (id: string | null) => (id === null ? undefined : boxes.get(id));
  const endBox = ring(end);
  const focusBox = ring(focus);
  return (
    <>
      <svg
        aria-hidden="true"
        className="pointer-events-none absolute top-0 left-0 z-0 overflow-visible"
        width="1"
        height="1"
        data-testid="path-edges"
      >
        {edges.map((e) => (
          <path
            key={e.id}
            d={e.d}
            data-path-edge={e.id}
            fill="none"
            style={{ ...EDGE_STYLE[e.kind], stroke: PATH_STROKE, strokeWidth: 3 }}
            markerEnd={`url(#${ARROW_IDS.path})`}
          />
        ))}
      </svg>
      {edges.some((e) => e.label) && (
        <EdgeLabelRenderer>
          {edges.map((e) =>
            e.label ? <EdgeLabel key={e.id} id={e.id} text={e.label.text} x={e.label.x} y={e.label.y} onPath /> : null,
          )}
        </EdgeLabelRenderer>
      )}
      <svg
        aria-hidden="true"
        className="pointer-events-none absolute top-0 left-0 z-[2] overflow-visible"
        width="1"
        height="1"
        data-testid="path-rings"
      >
        {[...pathNodes].map((id) => {
          const box = ring(id);
          return box && id !== end ? (
            <Ring key={id} box={box} offset={2} strokeWidth={2} className="stroke-accent-muted" data-path-node={id} />
          ) : null;
        })}
        {endBox && end !== null && (
          <g data-path-node={end} data-path-end="true">
            <Ring box={endBox} offset={3} strokeWidth={5} className="stroke-accent/40" />
            <Ring box={endBox} offset={2} strokeWidth={2} className="stroke-accent" />
          </g>
        )}
        {focusBox && focus !== null && (
          <Ring
            box={focusBox}
            offset={7}
            strokeWidth={2}
            strokeDasharray="5 4"
            className="stroke-ink-200"
            data-focus-node={focus}
          />
        )}
      </svg>
    </>
  );
}

export const edgeTypes = { move: memo(MoveEdgeView) };
