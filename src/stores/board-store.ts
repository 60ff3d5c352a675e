import { createStore } from "zustand/vanilla";
import { newSituationId, type BoardCell, type BoardDocument, type BoardSituationDoc } from "@/lib/board";
import type { ValueTable } from "@/lib/engine";
import { startTiming } from "@/lib/timing";

/** Where the editor's copy stands against the server's. */
export type SaveState =
  | { kind: "saved" }
  | { kind: "unsaved" }
  | { kind: "saving" }
  | { kind: "error"; message: string }
  /** Someone saved since this copy was read: theirs is kept beside ours until the coach chooses. */
  | { kind: "conflict"; theirs: { version: number; title: string; document: BoardDocument } };

export interface BoardState {
  title: string;
  version: number;
  document: BoardDocument;
  /** The situation whose matrix is open. */
  selected: string;
  /** The cell whose detail is open in the selected situation, as [row, col]. */
  cell: [number, number] | null;
  save: SaveState;
}

export interface BoardActions {
  select: (situation: string) => void;
  pickCell: (cell: [number, number] | null) => void;
  setTitle: (title: string) => void;
  /** Changes the selected situation through `change`, which returns its new copy. */
  editSituation: (change: (s: BoardSituationDoc) => BoardSituationDoc) => void;
  setCell: (row: number, col: number, change: Partial<BoardCell>) => void;
  addOption: (side: "rows" | "cols") => void;
  removeOption: (side: "rows" | "cols", index: number) => void;
  /** Adds a situation that the selected one's cell [row, col] leads to, and opens it. */
  addChild: (row: number, col: number) => void;
  /** Removes a situation other than the root, and every link into it. */
  removeSituation: (id: string) => void;
  setValues: (values: ValueTable) => void;
  setSave: (save: SaveState) => void;
  /** The server's copy replaces the editor's (after a save, or when a coach keeps theirs). */
  loaded: (server: { version: number; title: string; document: BoardDocument }) => void;
}

export type BoardStore = BoardState & BoardActions;

const emptyCell = (): BoardCell => ({ basis: null, override: 0, next: null });

function optionName(side: "rows" | "cols", taken: readonly string[]): string {
  const stem = side === "rows" ? "Option" : "Answer";
  let n = taken.length + 1;
  while (taken.includes(`${stem} ${n}`)) n++;
  return `${stem} ${n}`;
}

/** What a board page starts from: the server's copy. */
export type BoardInit = Pick<BoardState, "title" | "version" | "document">;

/** One store per board page (never global), as the Explorer's. */
export const createBoardStore = (initial: BoardInit) =>
  createStore<BoardStore>()((set) => {
    /** Every edit goes through here: the copy is now ahead of the server's. */
    const edit = (change: (s: BoardState) => Partial<BoardState>) => {
      // Timing only (npm run bench:ui): from the edit to the paint of the re-solved board.
      startTiming("board-solve");
      set((s) => ({
        ...change(s),
        save: s.save.kind === "conflict" ? s.save : { kind: "unsaved" },
      }));
    };
    const mapSelected = (s: BoardState, change: (x: BoardSituationDoc) => BoardSituationDoc): BoardDocument => ({
      ...s.document,
      situations: s.document.situations.map((x) => (x.id === s.selected ? change(x) : x)),
    });

    return {
      ...initial,
      selected: initial.document.root,
      cell: null,
      save: { kind: "saved" },
      select: (selected) => set({ selected, cell: null }),
      pickCell: (cell) => set({ cell }),
      setTitle: (title) => edit(() => ({ title })),
      editSituation: (change) => edit((s) => ({ document: mapSelected(s, change) })),
      setCell: (row, col, change) =>
        edit((s) => ({
          document: mapSelected(s, (x) => ({
            ...x,
            cells: x.cells.map((r, i) => (i === row ? r.map((c, j) => (j === col ? { ...c, ...change } : c)) : r)),
          })),
        })),
      addOption: (side) =>
        edit((s) => ({
          document: mapSelected(s, (x) =>
            side === "rows"
              ? { ...x, rows: [...x.rows, optionName("rows", x.rows)], cells: [...x.cells, x.cols.map(emptyCell)] }
              : { ...x, cols: [...x.cols, optionName("cols", x.cols)], cells: x.cells.map((r) => [...r, emptyCell()]) },
          ),
        })),
      removeOption: (side, index) =>
        edit((s) => ({
          cell: null,
          document: mapSelected(s, (x) =>
            side === "rows"
              ? { ...x, rows: x.rows.filter((_, i) => i !== index), cells: x.cells.filter((_, i) => i !== index) }
              : {
                  ...x,
                  cols: x.cols.filter((_, j) => j !== index),
                  cells: x.cells.map((r) => r.filter((_, j) => j !== index)),
                },
          ),
        })),
      addChild: (row, col) =>
        edit((s) => {
          const id = newSituationId(s.document);
          const parent = s.document.situations.find((x) => x.id === s.selected)!;
          const child: BoardSituationDoc = {
            id,
            name: `After ${parent.rows[row]} against ${parent.cols[col]}`.slice(0, 80),
            note: "",
            rows: ["Option 1", "Option 2"],
            cols: ["Answer 1", "Answer 2"],
            cells: [
              [emptyCell(), emptyCell()],
              [emptyCell(), emptyCell()],
            ],
          };
          const document = mapSelected(s, (x) => ({
            ...x,
            cells: x.cells.map((r, i) => (i === row ? r.map((c, j) => (j === col ? { ...c, next: id } : c)) : r)),
          }));
          return { document: { ...document, situations: [...document.situations, child] }, selected: id, cell: null };
        }),
      removeSituation: (id) =>
        edit((s) => {
          if (id === s.document.root) return {};
          const situations = s.document.situations
            .filter((x) => x.id !== id)
            .map((x) => ({
              ...x,
              cells: x.cells.map((r) => r.map((c) => (c.next === id ? { ...c, next: null } : c))),
            }));
          return {
            document: { ...s.document, situations },
            selected: s.selected === id ? s.document.root : s.selected,
            cell: null,
          };
        }),
      setValues: (values) => edit((s) => ({ document: { ...s.document, values } })),
      setSave: (save) => set({ save }),
      loaded: ({ version, title, document }) =>
        set((s) => ({
          version,
          title,
          document,
          save: { kind: "saved" },
          selected: document.situations.some((x) => x.id === s.selected) ? s.selected : document.root,
          cell: null,
        })),
    };
  });
