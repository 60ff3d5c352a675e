"use client";

import { createContext, useContext, useState, type ReactNode } from "react";
import { useStore } from "zustand";
import type { ExplorerState } from "@/lib/explorer";
import { createExplorerStore, type ExplorerStore } from "@/stores/explorer-store";

const ExplorerStoreContext = createContext<ReturnType<typeof createExplorerStore> | null>(null);

export function ExplorerStoreProvider({ initial, children }: { initial: ExplorerState; children: ReactNode }) {
  const [store] = useState(() => createExplorerStore(initial));
  return <ExplorerStoreContext.Provider value={store}>{children}</ExplorerStoreContext.Provider>;
}

export function useExplorerStore<T>(selector: (s: ExplorerStore) => T): T {
  const store = useContext(ExplorerStoreContext);
  if (!store) throw new Error("useExplorerStore is used outside ExplorerStoreProvider");
  return useStore(store, selector);
}
