"use client";

import { BaseEdge, EdgeLabelRenderer, getBezierPath, getSmoothStepPath, type Edge, type EdgeProps } from "@xyflow/react";
import { memo } from "react";
import type { MoveGraph } from "@/lib/engine";
import { useCanvas } from "./nodes";

export const EDGE_STYLE = {
  follow: { stroke: "#7d8aa3", strokeWidth: 1.5 },
  cancel: { stroke: "#f5c451", strokeWidth: 1.5, strokeDasharray: "6 4" },
  enter: { stroke: "#6fd0b4", strokeWidth: 1.5, strokeDasharray: "1 4", strokeLinecap: "round" as const },
};
const PATH_STROKE = "#ffd873";

/** Arrowheads, drawn once for the canvas: one per edge kind and one for the selected path. */
export const ARROW_IDS = { follow: "ff-arrow-follow", cancel: "ff-arrow-cancel", enter: "ff-arrow-enter", path: "ff-arrow-path" } as const;

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
          <marker key={id} id={id} viewBox="-10 -10 20 20" markerWidth="16" markerHeight="16" orient="auto-start-reverse" refX="0" refY="0" markerUnits="userSpaceOnUse">
            <polyline points="-5,-4 0,0 -5,4 -5,-4" fill={color} stroke={color} strokeLinejoin="round" strokeLinecap="round" strokeWidth="1" />
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
 * the selected path is read from the canvas store (so the edge objects never
 * change), and labels are HTML, so drawing one never measures SVG text.
 */
function MoveEdgeView({ id, data, sourceX, sourceY, targetX, targetY, sourcePosition, targetPosition }: EdgeProps<MoveFlowEdge>) {
  const onPath = useCanvas(id, (m) => m.pathEdges.has(id));
  const kind = data?.kind ?? "follow";
  const geometry = { sourceX, sourceY, targetX, targetY, sourcePosition, targetPosition };
  const [path, labelX, labelY] = kind === "follow" ? getBezierPath(geometry) : getSmoothStepPath(geometry);
  const style = onPath ? { ...EDGE_STYLE[kind], stroke: PATH_STROKE, strokeWidth: 3 } : EDGE_STYLE[kind];
  return (
    <>
      {/* No wide invisible stroke to catch the pointer: edges take no clicks, and the browser
          hit-tests the pointer against every one after each layout under the cursor. */}
      <BaseEdge id={id} path={path} style={style} interactionWidth={0} markerEnd={`url(#${onPath ? ARROW_IDS.path : ARROW_IDS[kind]})`} />
      {data?.label && (
        <EdgeLabelRenderer>
          <div
            data-edge-label={id}
            style={{ transform: `translate(-50%, -50%) translate(${labelX}px, ${labelY}px)` }}
            className={`pointer-events-none absolute rounded bg-ink-950 px-1 py-px font-mono text-[11px] ${onPath ? "text-accent" : "text-ink-200"}`}
          >
            {data.label}
          </div>
        </EdgeLabelRenderer>
      )}
    </>
  );
}

export const edgeTypes = { move: memo(MoveEdgeView) };
