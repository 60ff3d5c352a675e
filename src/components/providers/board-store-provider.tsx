"use client";

import { createContext, useContext, useState, type ReactNode } from "react";
import { useStore } from "zustand";

import { createBoardStore, type BoardInit, type BoardStore } from "@/stores/board-store";

const BoardStoreContext = createContext<ReturnType<typeof createBoardStore> | null>(null);

export function BoardStoreProvider({ initial, children }: { initial: BoardInit; children: ReactNode }) {
  const [store] = useState(() => createBoardStore(initial));
  return <BoardStoreContext.Provider value={store}>{children}</BoardStoreContext.Provider>;
}

export function useBoardStore<T>(selector: (s: BoardStore) => T): T {
  const store = useContext(BoardStoreContext);
  if (!store) throw new Error("useBoardStore is used outside BoardStoreProvider");
  return useStore(store, selector);
}
