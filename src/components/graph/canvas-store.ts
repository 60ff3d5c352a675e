import type { BlockRules } from "@/components/ui/block-class";

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

/**
 * A store keyed by node and edge id. A general store (zustand's) calls every
 * subscriber on each change, and with a few hundred nodes and edges that is
 * most of a click's script time; this one calls only the subscribers of the
 * ids whose marks changed, or all of them when a rule changed.
 */
export interface CanvasStore {
  getState(): CanvasMarks;
  setState(next: CanvasMarks): void;
  /** Listens for changes to the marks of one node or edge. */
  subscribe(id: string, listener: () => void): () => void;
}

/** The node and edge ids whose marks differ between two states, or `"all"` when a rule changed. */
export function changedIds(prev: CanvasMarks, next: CanvasMarks): ReadonlySet<string> | "all" {
  if (prev.fastest !== next.fastest || prev.launchAt !== next.launchAt) return "all";
  const ids = new Set<string>();
  const diff = (a: ReadonlySet<string>, b: ReadonlySet<string>) => {
    if (a === b) return;
    for (const id of a) if (!b.has(id)) ids.add(id);
    for (const id of b) if (!a.has(id)) ids.add(id);
  };
  const one = (a: string | null, b: string | null) => {
    if (a === b) return;
    if (a !== null) ids.add(a);
    if (b !== null) ids.add(b);
  };
  diff(prev.pathNodes, next.pathNodes);
  diff(prev.pathEdges, next.pathEdges);
  one(prev.end, next.end);
  one(prev.focus, next.focus);
  return ids;
}

export function createCanvasStore(initial: CanvasMarks): CanvasStore {
  let state = initial;
  const listeners = new Map<string, Set<() => void>>();
  return {
    getState: () => state,
    setState(next) {
      if (next === state) return;
      const changed = changedIds(state, next);
      state = next;
      if (changed === "all") {
        for (const set of listeners.values()) for (const listener of set) listener();
        return;
      }
      for (const id of changed) listeners.get(id)?.forEach((listener) => listener());
    },
    subscribe(id, listener) {
      let set = listeners.get(id);
      if (!set) listeners.set(id, (set = new Set()));
      set.add(listener);
      return () => {
        set.delete(listener);
        if (set.size === 0) listeners.delete(id);
      };
    },
  };
}
