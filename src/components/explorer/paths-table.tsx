"use client";

import { useVirtualizer, type Virtualizer } from "@tanstack/react-virtual";
import { memo, useEffect, useMemo, useRef, useState, type JSX, type KeyboardEvent } from "react";
import {
  createColumnHelper,
  useTable,
  FlexRender,
  type Row,
  type SortFn,
  type SortingState,
} from "@tanstack/react-table";
import { FilterForm, NoRows, ShownCount } from "@/components/ui/filter-form";
import { SortableHeading } from "@/components/ui/sort-button";
import { sortingFeatures } from "@/components/ui/sorting-features";
import { BLOCK_CLASS_STYLE, type BlockRules } from "@/components/ui/block-class";
import { Frames } from "@/components/ui/frames";
import { LevelBadge } from "@/components/ui/level-badge";
import { afterNextPaint } from "@/lib/after-paint";
import {
  BLOCK_CLASS_WORD,
  explainFramesSaved,
  explainGap,
  explainOnBlock,
  explainOnHit,
  type BlockClass,
  type GraphNode,
  type MoveGraph,
  type PathResult,
} from "@/lib/engine";
import { hitOnBlockBeforeCancel, pathKey } from "@/lib/explorer";
import {
  BLOCK_CLASSES,
  compareOutcome,
  filterPaths,
  hasFilters,
  NO_FILTERS,
  ON_HIT_KINDS,
  outcomeSortValue,
  type OnHitKind,
  type PathFilters,
} from "@/lib/paths-filter";

/** Height of one row in pixels: one line of text-sm, py-1 and a 1px top border (every cell is nowrap). */
const ROW_HEIGHT = 29;
/** Rows drawn beyond each edge of the box, so a quick scroll does not show blanks. */
const OVERSCAN = 8;

const features = sortingFeatures;
type PathRowModel = Row<typeof features, PathResult>;
type Features = typeof features;
const col = createColumnHelper<Features, PathResult>();

// The words and colours beside each class are the move list's, read from the path's own
// `blockClass`: the engine computed it with the rules the paths were explored with.

// The accessors of outcome columns give `undefined` for a state, so `sortUndefined: "last"` keeps
// states below every number whichever way the column is sorted; numbers are ordered by compareOutcome.
const byOutcome =
  (field: "onBlock" | "onHit"): SortFn<Features, PathResult> =>
  (a, b) =>
    compareOutcome(a.original[field], b.original[field]);
const byNumber: SortFn<Features, PathResult> = (a, b, id) => a.getValue<number>(id) - b.getValue<number>(id);

function gapsTitle(p: PathResult): string {
  if (p.gaps.length === 0) return "No gap on block: the defender is never free between hits.";
  return p.gaps.map((g) => `After hit ${g.after + 1}: ${explainGap(g.frames)}.`).join(" ");
}

function buildColumns(rules: BlockRules, nodes: ReadonlyMap<string, GraphNode>) {
  return col.columns([
    col.accessor((p) => p.input, {
      id: "input",
      header: "Input",
      enableSorting: false,
      cell: (c) => <span className="font-mono text-ink-100">{c.row.original.input}</span>,
    }),
    col.display({
      id: "levels",
      header: "Hits",
      cell: (c) => (
        <span className="flex gap-0.5" aria-label={c.row.original.levels.join(", ")}>
          {c.row.original.levels.map((l, i) => (
            <LevelBadge key={i} level={l} />
          ))}
        </span>
      ),
    }),
    col.accessor((p) => p.damage, {
      id: "damage",
      header: "Damage",
      sortFn: byNumber,
      cell: (c) => (
        <span className="font-mono tabular-nums" title="The sum of the hits' damage, with no scaling.">
          {c.row.original.damage}
        </span>
      ),
    }),
    col.accessor((p) => outcomeSortValue(p.onBlock), {
      id: "onBlock",
      header: "On block",
      sortFn: byOutcome("onBlock"),
      sortUndefined: "last",
      cell: (c) => <Frames value={c.row.original.onBlock} title={explainOnBlock(c.row.original.onBlock, rules)} />,
    }),
    col.accessor((p) => p.blockClass, {
      id: "blockClass",
      header: "Block class",
      enableSorting: false,
      cell: (c) => {
        const cls = c.row.original.blockClass;
        return <span className={`text-[11px] ${BLOCK_CLASS_STYLE[cls]}`}>{BLOCK_CLASS_WORD[cls]}</span>;
      },
    }),
    col.accessor((p) => outcomeSortValue(p.onHit), {
      id: "onHit",
      header: "On hit",
      sortFn: byOutcome("onHit"),
      sortUndefined: "last",
      cell: (c) => <Frames value={c.row.original.onHit} title={explainOnHit(c.row.original.onHit)} />,
    }),
    col.display({
      id: "onCounterHit",
      header: "On counter hit",
      cell: (c) => (
        <Frames
          value={c.row.original.onCounterHit}
          title={explainOnHit(c.row.original.onCounterHit, { counterHit: true })}
        />
      ),
    }),
    col.accessor((p) => p.framesSaved ?? undefined, {
      id: "framesSaved",
      header: "Frames saved",
      sortFn: byNumber,
      sortUndefined: "last",
      cell: (c) => {
        const p = c.row.original;
        const raw = hitOnBlockBeforeCancel(p, nodes);
        if (p.framesSaved === null || raw === null) return <span className="text-ink-600">—</span>;
        return (
          <span className="font-mono tabular-nums" title={explainFramesSaved(p.onBlock, raw)}>
            {p.framesSaved}f
          </span>
        );
      },
    }),
    col.display({
      id: "endsIn",
      header: "Ends in",
      cell: (c) => (
        <span className={c.row.original.endsIn === "stance" ? "text-ink-100" : "text-ink-400"}>
          {c.row.original.endsIn}
        </span>
      ),
    }),
    col.display({
      id: "naturalCombo",
      header: "Natural combo",
      cell: (c) =>
        c.row.original.naturalCombo ? (
          <span
            className="text-block-plus"
            title="Every hit after the first is guaranteed once the previous one connects."
          >
            yes
          </span>
        ) : (
          <span className="text-ink-400">no</span>
        ),
    }),
    col.display({
      id: "gaps",
      header: "Gaps",
      cell: (c) => (
        <span
          className={`font-mono tabular-nums ${c.row.original.gaps.length === 0 ? "text-ink-400" : ""}`}
          title={gapsTitle(c.row.original)}
        >
          {c.row.original.gaps.length}
        </span>
      ),
    }),
  ]);
}

const HEADER_HINT: Partial<Record<string, string>> = {
  levels: "Hit level of each hit, in order",
  onBlock: "Frame advantage if the last step is blocked, and its block class",
  framesSaved: "On block, how much better the cancel leaves you than stopping at the hit",
  endsIn: "Whether the path stops on a hit or in a stance",
  naturalCombo: "Every hit after the first is guaranteed once the previous one connects",
  gaps: "Steps on block where the defender is free before the next hit",
};

const classOption = (cls: BlockClass) => (cls === "state" ? "state (no number)" : BLOCK_CLASS_WORD[cls]);

const control = "rounded border border-ink-700 bg-ink-900 px-1.5 py-0.5 text-ink-100";

/** The form keeps the damage field as typed, so an empty or half-typed number does not fight the user. */
type FormState = Omit<PathFilters, "minDamage"> & { minDamage: string };
const EMPTY_FORM: FormState = { ...NO_FILTERS, minDamage: "" };

function toFilters(form: FormState): PathFilters {
  const text = form.minDamage.trim();
  const n = Number(text);
  return { ...form, minDamage: text === "" || !Number.isFinite(n) ? null : n };
}

/** Every path from this root in one sortable, filterable table; picking a row selects the path. */
/** Memoised: it re-renders when its paths, selection or rules change, not on every render of the Explorer. */
export const PathsTable = memo(function PathsTable(props: {
  paths: PathResult[];
  /** The graph the paths run through: the cancelled hits' own endings are read from it. */
  graph: MoveGraph;
  selectedKey: string | null;
  onSelect: (pathKey: string) => void;
  rules: { fastest: number; launchAt: number };
}): JSX.Element {
  const { paths, graph, selectedKey, onSelect } = props;
  const { fastest, launchAt } = props.rules;

  const [form, setForm] = useState<FormState>(EMPTY_FORM);
  const [sorting, setSorting] = useState<SortingState>([]);
  const filters = useMemo(() => toFilters(form), [form]);
  const data = useMemo(() => filterPaths(paths, filters), [paths, filters]);
  // Keyed on the numbers: callers often pass a fresh rules object on every render.
  const columns = useMemo(
    () => buildColumns({ fastest, launchAt }, new Map(graph.nodes.map((n) => [n.id, n]))),
    [fastest, launchAt, graph],
  );

  const table = useTable({
    features,
    columns,
    data,
    getRowId: (p) => pathKey(p),
    state: { sorting },
    onSortingChange: setSorting,
    enableMultiSort: false,
    // Players look for the most damage and the best advantage first.
    sortDescFirst: true,
  });

  const rows = table.getRowModel().rows;
  const filtered = hasFilters(filters);
  const selectedIndex = selectedKey === null ? -1 : rows.findIndex((r) => r.id === selectedKey);

  // Only the rows in view (and a few either side) are in the DOM: a root can have thousands of
  // paths, and every row drawn costs style and layout on each selection.
  const scrollRef = useRef<HTMLDivElement>(null);
  const virtualizer = useVirtualizer({
    count: rows.length,
    getScrollElement: () => scrollRef.current,
    estimateSize: () => ROW_HEIGHT,
    getItemKey: (i) => rows[i]!.id,
    overscan: OVERSCAN,
    // Server render and the first paint before the box is measured: a screenful of rows.
    initialRect: { width: 0, height: 384 },
  });
  // Once the selection is painted: the card and the highlight come first, the table's scroll
  // (and the rows it brings in) in the frame after.
  useEffect(() => {
    if (selectedIndex < 0) return;
    return afterNextPaint(() => keepRowInView(virtualizer, selectedIndex));
  }, [selectedIndex, virtualizer]);
  const items = virtualizer.getVirtualItems();
  const padTop = items[0]?.start ?? 0;
  const padBottom = items.length > 0 ? virtualizer.getTotalSize() - items[items.length - 1]!.end : 0;

  const set = <K extends keyof FormState>(key: K, value: FormState[K]) => setForm((f) => ({ ...f, [key]: value }));
  const clear = () => setForm(EMPTY_FORM);

  return (
    <section aria-labelledby="paths-table-title" className="space-y-2" data-testid="paths-table">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="paths-table-title" className="text-xs tracking-wider text-ink-400 uppercase">
          All paths from this root
        </h2>
        <ShownCount shown={data.length} of={paths.length} testId="paths-count"></ShownCount>
      </div>

      <FilterForm label="Filter paths">
        <label className="flex items-center gap-2">
          <span className="text-ink-400">Ending class</span>
          <select
            value={form.blockClass}
            onChange={(e) => set("blockClass", e.target.value as FormState["blockClass"])}
            className={control}
          >
            <option value="any">any</option>
            {BLOCK_CLASSES.map((c) => (
              <option key={c} value={c}>
                {classOption(c)}
              </option>
            ))}
          </select>
        </label>
        <label className="flex items-center gap-2">
          <span className="text-ink-400">Min. damage</span>
          <input
            type="number"
            inputMode="numeric"
            min={0}
            step={1}
            value={form.minDamage}
            onChange={(e) => set("minDamage", e.target.value)}
            className={`${control} w-16 font-mono`}
          />
        </label>
        <label className="flex items-center gap-2">
          <span className="text-ink-400">On hit</span>
          <select
            value={form.onHit}
            onChange={(e) => set("onHit", e.target.value as OnHitKind | "any")}
            className={control}
          >
            <option value="any">any</option>
            {ON_HIT_KINDS.map((k) => (
              <option key={k} value={k}>
                {k === "numeric" ? "a number" : k}
              </option>
            ))}
          </select>
        </label>
        <label className="flex items-center gap-2">
          <input
            type="checkbox"
            checked={form.stanceOnly}
            onChange={(e) => set("stanceOnly", e.target.checked)}
            className="accent-accent"
          />
          <span className="text-ink-300">Ends in stance only</span>
        </label>
        <label className="flex items-center gap-2">
          <input
            type="checkbox"
            checked={form.naturalOnly}
            onChange={(e) => set("naturalOnly", e.target.checked)}
            className="accent-accent"
          />
          <span className="text-ink-300">Natural combos only</span>
        </label>
        <button
          type="button"
          onClick={clear}
          disabled={!filtered && form.minDamage === ""}
          className="rounded border border-ink-700 px-2 py-0.5 text-xs text-ink-300 hover:border-ink-600 hover:text-ink-100 disabled:opacity-40"
        >
          Clear filters
        </button>
      </FilterForm>

      {selectedKey !== null && selectedIndex < 0 && data.length > 0 && (
        <p className="text-xs text-ink-400">The selected path is filtered out of this list.</p>
      )}

      <div
        ref={scrollRef}
        className="max-h-96 overflow-auto rounded-lg border border-ink-800 bg-ink-900 [contain:content]"
      >
        {rows.length === 0 ? (
          <NoRows
            message={filtered ? "No path matches these filters" : "No paths from this root"}
            onClear={filtered ? clear : undefined}
          />
        ) : (
          <table
            className="min-w-full border-separate border-spacing-0 text-sm"
            aria-labelledby="paths-table-title"
            aria-rowcount={rows.length + 1}
          >
            <thead>
              {table.getHeaderGroups().map((group) => (
                <tr key={group.id}>
                  {group.headers.map((header) => {
                    const id = header.column.id;
                    // The class word sits under the "On block" heading, which spans both cells.
                    if (id === "blockClass") return null;
                    const base =
                      "sticky top-0 whitespace-nowrap border-b border-ink-700 bg-ink-900 px-2 py-1.5 text-left text-xs font-medium text-ink-400";
                    return (
                      <SortableHeading
                        key={header.id}
                        column={header.column}
                        colSpan={id === "onBlock" ? 2 : undefined}
                        title={HEADER_HINT[id]}
                        className={`${base} ${id === "input" ? "left-0 z-20" : "z-10"}`}
                      >
                        <table.FlexRender header={header} />
                      </SortableHeading>
                    );
                  })}
                </tr>
              ))}
            </thead>
            <tbody>
              {padTop > 0 && <tr aria-hidden="true" style={{ height: padTop }} />}
              {items.map((item) => {
                const row = rows[item.index]!;
                return (
                  <PathRow
                    key={row.id}
                    row={row}
                    index={item.index}
                    selected={row.id === selectedKey}
                    onSelect={onSelect}
                    virtualizer={virtualizer}
                  />
                );
              })}
              {padBottom > 0 && <tr aria-hidden="true" style={{ height: padBottom }} />}
            </tbody>
          </table>
        )}
      </div>
    </section>
  );
});

type RowVirtualizer = Virtualizer<HTMLDivElement, Element>;

/** Height of the sticky header row, which covers the top of the box. */
const HEAD_HEIGHT = 29;

/**
 * Scrolls the box, never the page, just enough to show row `index` below the
 * sticky header. Reads only what the virtualiser already knows (its scroll
 * offset and box size, kept from scroll and resize events), so selecting a row
 * that is already in view forces no layout at all.
 */
function keepRowInView(virtualizer: RowVirtualizer, index: number) {
  const box = virtualizer.scrollElement;
  if (!box) return;
  const offset = virtualizer.scrollOffset ?? 0;
  const height = virtualizer.scrollRect?.height ?? 0;
  const top = HEAD_HEIGHT + index * ROW_HEIGHT;
  if (top < offset + HEAD_HEIGHT) box.scrollTop = top - HEAD_HEIGHT;
  else if (top + ROW_HEIGHT > offset + height) box.scrollTop = top + ROW_HEIGHT - height;
}

function onRowKey(
  e: KeyboardEvent<HTMLTableRowElement>,
  key: string,
  index: number,
  onSelect: (key: string) => void,
  virtualizer: RowVirtualizer,
) {
  if (e.key === "Enter" || e.key === " ") {
    e.preventDefault();
    onSelect(key);
  } else if (e.key === "ArrowDown" || e.key === "ArrowUp") {
    const target = index + (e.key === "ArrowDown" ? 1 : -1);
    if (target < 0 || target >= virtualizer.options.count) return;
    e.preventDefault();
    // The next row may not be drawn yet: scroll it in, then focus it once it is.
    keepRowInView(virtualizer, target);
    const body = e.currentTarget.parentElement;
    const focus = (tries: number) => {
      const next = body?.querySelector<HTMLElement>(`tr[data-index="${target}"]`);
      if (next) next.focus();
      else if (tries > 0) requestAnimationFrame(() => focus(tries - 1));
    };
    focus(3);
  }
}

/**
 * One row, memoised: selecting a path re-renders the two rows whose
 * selection changed, not every row in view (the row objects are stable while
 * the data and sorting are).
 */
const PathRow = memo(function PathRow({
  row,
  index,
  selected,
  onSelect,
  virtualizer,
}: {
  row: PathRowModel;
  index: number;
  selected: boolean;
  onSelect: (key: string) => void;
  virtualizer: RowVirtualizer;
}) {
  const key = row.id;
  // The sticky input cell needs its own opaque background to hide what scrolls under it.
  const bg = selected ? "bg-ink-800" : "bg-ink-900 hover:bg-ink-850";
  const stickyBg = selected ? "bg-ink-800" : "bg-ink-900 group-hover:bg-ink-850";
  return (
    <tr
      data-index={index}
      data-path-key={key}
      aria-rowindex={index + 2}
      tabIndex={0}
      aria-selected={selected}
      onClick={() => onSelect(key)}
      onKeyDown={(e) => onRowKey(e, key, index, onSelect, virtualizer)}
      className={`path-row group ${bg}`}
    >
      {row.getAllCells().map((cell) => {
        const id = cell.column.id;
        const first = id === "input";
        return (
          <td
            key={cell.id}
            data-field={id}
            className={`path-cell ${
              first
                ? `sticky left-0 z-[1] border-l-2 ${selected ? "border-l-accent" : "border-l-transparent"} ${stickyBg}`
                : ""
            } ${id === "blockClass" ? "pl-0" : ""}`}
          >
            <FlexRender cell={cell} />
          </td>
        );
      })}
    </tr>
  );
});
