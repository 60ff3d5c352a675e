"use client";

import { createContext, useContext, useLayoutEffect, useState, type ReactNode } from "react";
import { useStore } from "zustand";
import { createCanvasStore, type CanvasMarks, type CanvasStore, type CanvasStoreApi } from "@/stores/canvas-store";

const CanvasStoreContext = createContext<CanvasStoreApi | null>(null);

/** One canvas store for the graph drawn inside; `marks` reach it before the browser paints. */
export function CanvasStoreProvider({ marks, children }: { marks: CanvasMarks; children: ReactNode }) {
  const [store] = useState(() => createCanvasStore(marks));
  useLayoutEffect(() => store.getState().setMarks(marks), [store, marks]);
  return <CanvasStoreContext value={store}>{children}</CanvasStoreContext>;
}

/**
 * Reads the canvas store of the graph being drawn. A component re-renders only
 * when what `selector` returns changes, so a node selects a primitive.
 */
export function useCanvasStore<T>(selector: (s: CanvasStore) => T): T {
  const store = useContext(CanvasStoreContext);
  if (!store) throw new Error("Graph nodes and edges need a CanvasStoreProvider");
  return useStore(store, selector);
}
