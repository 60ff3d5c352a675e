import { createStore } from "zustand/vanilla";

export interface ExplorerOptions {
  maxDepth: number;
  maxStanceVisits: number;
  fastest: number;
}

export interface ExplorerState {
  /** The Edition's slug; switching it fetches that Edition's graph, without a navigation. */
  edition: string;
  /** The selected path, by its edge ids joined (see `pathKey`); "" is the root alone. */
  selected: string | null;
  options: ExplorerOptions;
  /** The character whose moves punish the ending; null: the same character. */
  opponent: number | null;
}

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
