import { createStore } from "zustand/vanilla";
import type { MoveGraph } from "@/lib/engine";

/**
 * What the canvas draws on top of the graph: the block rules and the selected
 * path. It lives in a store of its own, not in the nodes' and edges' data, so
 * React Flow's node and edge objects never change when the user selects a
 * path or changes a rule, and React Flow re-measures nothing.
 */
export interface CanvasMarks {
  /** The opponent's fastest attack: the rule a node's block class depends on, with `launchAt`. */
  fastest: number;
  launchAt: number;
  pathNodes: ReadonlySet<string>;
  pathEdges: ReadonlySet<string>;
  end: string | null;
  /** The keyboard's place in the graph. */
  focus: string | null;
}

/** An edge as the canvas drew it: its SVG path, its kind (which sets its dashes) and its label. */
export interface DrawnEdge {
  d: string;
  kind: MoveGraph["edges"][number]["kind"];
  label: { text: string; x: number; y: number } | null;
}

export interface CanvasState extends CanvasMarks {
  /**
   * Counts the changes of what the path overlay draws: the path's nodes and
   * edges, its end, the keyboard's place, or where one of the path's edges is drawn.
   */
  overlayVersion: number;
}

export interface CanvasActions {
  /** Takes the canvas's new marks; keeps the old path sets when they hold the same ids. */
  setMarks: (next: CanvasMarks) => void;
  /** Records where an edge is drawn (`null` when it is no longer drawn). */
  setDrawnEdge: (id: string, drawn: DrawnEdge | null) => void;
  drawnEdge: (id: string) => DrawnEdge | undefined;
}

/**
 * The canvas's store. Two kinds of reader: every node selects the rules (its
 * block class depends on them, and a selector returning the same class
 * re-renders nothing), and the one path overlay selects the path and
 * `overlayVersion` ({@link selectOverlay}). A click re-renders the overlay
 * alone: no node or edge of React Flow's.
 */
export type CanvasStore = CanvasState & CanvasActions;

/** True when two sets hold the same ids. */
function sameIds(a: ReadonlySet<string>, b: ReadonlySet<string>): boolean {
  if (a === b) return true;
  if (a.size !== b.size) return false;
  for (const id of a) if (!b.has(id)) return false;
  return true;
}

/** Whether the overlay draws something else for `next` than for `prev`. */
export function overlayChanged(prev: CanvasMarks, next: CanvasMarks): boolean {
  return (
    prev.end !== next.end ||
    prev.focus !== next.focus ||
    !sameIds(prev.pathNodes, next.pathNodes) ||
    !sameIds(prev.pathEdges, next.pathEdges)
  );
}

const sameDrawn = (a: DrawnEdge | undefined, b: DrawnEdge | null) =>
  (a ?? null) === b ||
  (a !== undefined &&
    b !== null &&
    a.d === b.d &&
    a.kind === b.kind &&
    a.label?.text === b.label?.text &&
    a.label?.x === b.label?.x &&
    a.label?.y === b.label?.y);

/** What the path overlay reads; select it with `useShallow`, so only a change of these re-renders it. */
export const selectOverlay = (s: CanvasStore) => ({
  pathNodes: s.pathNodes,
  pathEdges: s.pathEdges,
  end: s.end,
  focus: s.focus,
  version: s.overlayVersion,
  drawnEdge: s.drawnEdge,
});

/** One store per canvas (never global). */
export const createCanvasStore = (initial: CanvasMarks) => {
  // Where each edge is drawn: written by the edges as React Flow places them, read by the
  // overlay. Kept beside the state, not in it: only a path edge's drawing is news to anyone.
  const drawn = new Map<string, DrawnEdge>();
  return createStore<CanvasStore>()((set, get) => ({
    ...initial,
    overlayVersion: 0,
    setMarks: (next) => {
      const prev = get();
      const rules = prev.fastest !== next.fastest || prev.launchAt !== next.launchAt;
      const overlay = overlayChanged(prev, next);
      if (!rules && !overlay) return;
      set({
        ...(rules && { fastest: next.fastest, launchAt: next.launchAt }),
        ...(overlay && {
          pathNodes: next.pathNodes,
          pathEdges: next.pathEdges,
          end: next.end,
          focus: next.focus,
          overlayVersion: prev.overlayVersion + 1,
        }),
      });
    },
    setDrawnEdge: (id, edge) => {
      if (sameDrawn(drawn.get(id), edge)) return;
      if (edge === null) drawn.delete(id);
      else drawn.set(id, edge);
      if (get().pathEdges.has(id)) set((s) => ({ overlayVersion: s.overlayVersion + 1 }));
    },
    drawnEdge: (id) => drawn.get(id),
  }));
};

export type CanvasStoreApi = ReturnType<typeof createCanvasStore>;
