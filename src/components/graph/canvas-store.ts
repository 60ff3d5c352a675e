import type { BlockRules } from "@/components/ui/block-class";
import type { MoveGraph } from "@/lib/engine";

/**
 * What the canvas draws on top of the graph: the block rules and the selected
 * path. It lives in a small store of its own, not in the nodes' and edges'
 * data, so React Flow's node and edge objects never change when the user
 * selects a path or changes a rule, and React Flow re-measures nothing.
 */
export type CanvasMarks = BlockRules & {
  pathNodes: ReadonlySet<string>;
  pathEdges: ReadonlySet<string>;
  end: string | null;
  /** The keyboard's place in the graph. */
  focus: string | null;
};

/** An edge as the canvas drew it: its SVG path, its kind (which sets its dashes) and its label. */
export interface DrawnEdge {
  d: string;
  kind: MoveGraph["edges"][number]["kind"];
  label: { text: string; x: number; y: number } | null;
}

/**
 * The canvas's store. Two kinds of listener: every node listens for the rules
 * (its block class depends on them), and the one path overlay listens for the
 * selection. A click re-renders the overlay alone: no node or edge of React
 * Flow's, so React walks none of their few hundred siblings either.
 */
export interface CanvasStore {
  getState(): CanvasMarks;
  setState(next: CanvasMarks): void;
  /** Listens for a change of the rules (the opponent's fastest attack, the launch threshold). */
  subscribeRules(listener: () => void): () => void;
  /**
   * Listens for a change of what the overlay draws: the path's nodes and
   * edges, its end, the keyboard's place, or where one of the path's edges is
   * drawn. `overlayVersion` counts those changes.
   */
  subscribeOverlay(listener: () => void): () => void;
  overlayVersion(): number;
  /** Records where an edge is drawn (`null` when it is no longer drawn). */
  setDrawnEdge(id: string, drawn: DrawnEdge | null): void;
  drawnEdge(id: string): DrawnEdge | undefined;
}

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

export function createCanvasStore(initial: CanvasMarks): CanvasStore {
  let state = initial;
  let version = 0;
  const ruleListeners = new Set<() => void>();
  const overlayListeners = new Set<() => void>();
  const drawn = new Map<string, DrawnEdge>();
  const listen = (set: Set<() => void>, listener: () => void) => {
    set.add(listener);
    return () => {
      set.delete(listener);
    };
  };
  const overlayNews = () => {
    version += 1;
    for (const listener of overlayListeners) listener();
  };
  return {
    getState: () => state,
    setState(next) {
      if (next === state) return;
      const prev = state;
      state = next;
      if (overlayChanged(prev, next)) overlayNews();
      if (prev.fastest !== next.fastest || prev.launchAt !== next.launchAt)
        for (const listener of ruleListeners) listener();
    },
    subscribeRules: (listener) => listen(ruleListeners, listener),
    subscribeOverlay: (listener) => listen(overlayListeners, listener),
    overlayVersion: () => version,
    setDrawnEdge(id, edge) {
      if (sameDrawn(drawn.get(id), edge)) return;
      if (edge === null) drawn.delete(id);
      else drawn.set(id, edge);
      if (state.pathEdges.has(id)) overlayNews();
    },
    drawnEdge: (id) => drawn.get(id),
  };
}
