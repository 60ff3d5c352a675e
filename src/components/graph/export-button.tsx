"use client";

import { Panel, getNodesBounds, getViewportForBounds, useReactFlow } from "@xyflow/react";
import { toPng } from "html-to-image";
import { downloadDataUrl } from "@/components/ui/download";
import { useState } from "react";

const WIDTH = 1600;
const HEIGHT = 900;

/**
 * Saves the whole graph as a PNG, as React Flow's own export example does:
 * fit every node into a fixed-size image and render the viewport element.
 */
export function ExportButton({ fileName }: { fileName: string }) {
  const { getNodes } = useReactFlow();
  const [state, setState] = useState<"idle" | "working" | "failed">("idle");

  const exportPng = async () => {
    const viewport = document.querySelector<HTMLElement>(".react-flow__viewport");
    if (!viewport) return;
    setState("working");
    try {
      const bounds = getNodesBounds(getNodes());
      const { x, y, zoom } = getViewportForBounds(bounds, WIDTH, HEIGHT, 0.2, 2, 0.08);
      const dataUrl = await toPng(viewport, {
        backgroundColor: "#0b0d12",
        width: WIDTH,
        height: HEIGHT,
        style: { width: `${WIDTH}px`, height: `${HEIGHT}px`, transform: `translate(${x}px, ${y}px) scale(${zoom})` },
      });
      downloadDataUrl(dataUrl, fileName);
      setState("idle");
    } catch {
      setState("failed");
    }
  };

  return (
    <Panel position="top-right">
      <button
        type="button"
        onClick={() => void exportPng()}
        disabled={state === "working"}
        className="rounded border border-ink-700 bg-ink-900 px-2 py-1 text-xs text-ink-200 hover:border-ink-400 disabled:opacity-60"
      >
        {state === "working" ? "Exporting…" : state === "failed" ? "Export failed: try again" : "Export PNG"}
      </button>
    </Panel>
  );
}
