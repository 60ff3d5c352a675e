import { createStore } from "zustand/vanilla";
import type { ExplorerOptions, ExplorerState } from "@/lib/explorer";

export interface ExplorerActions {
  setEdition: (slug: string) => void;
  setOpponent: (characterId: number | null) => void;
  select: (pathKey: string | null) => void;
  setOption: <K extends keyof ExplorerOptions>(key: K, value: ExplorerOptions[K]) => void;
}

export type ExplorerStore = ExplorerState & ExplorerActions;

/** One store per Explorer page (never global): the page's server data stays in SWR. */
export const createExplorerStore = (initial: ExplorerState) =>
  createStore<ExplorerStore>()((set) => ({
    ...initial,
    select: (selected) => set({ selected }),
    setEdition: (edition) => set({ edition }),
    setOpponent: (opponent) => set({ opponent }),
    setOption: (key, value) => set((s) => ({ options: { ...s.options, [key]: value } })),
  }));
