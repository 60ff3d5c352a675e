"use client";

import Link from "next/link";
import { useMemo, useState, type ReactNode } from "react";
import { createColumnHelper, useTable, FlexRender, type SortFn, type SortingState } from "@tanstack/react-table";
import { FilterForm, NoRows, ShownCount } from "@/components/ui/filter-form";
import { SortableHeading } from "@/components/ui/sort-button";
import { sortingFeatures } from "@/components/ui/sorting-features";
import { BLOCK_CLASS_STYLE } from "@/components/ui/block-class";
import { Frames } from "@/components/ui/frames";
import { BLOCK_CLASS_WORD, type BlockClass } from "@/lib/engine";
import type { ChangedPathRow, PathSide } from "@/lib/changes";
import { StatusTag } from "./item-changes";

interface EditionLink {
  slug: string;
  name: string;
}

const features = sortingFeatures;
type Features = typeof features;
const col = createColumnHelper<Features, ChangedPathRow>();

/** Best ending first; a state after every number. */
const CLASS_ORDER: Record<BlockClass, number> = {
  plus: 0,
  even: 1,
  safe: 2,
  punishable: 3,
  "launch-punishable": 4,
  state: 5,
};
const STATUS_ORDER = { changed: 0, added: 1, removed: 2 } as const;

/** The side a row is sorted by: the new one, or the old one for a path that is gone. */
const current = (r: ChangedPathRow): PathSide => r.after ?? r.before ?? {};

const byClass: SortFn<Features, ChangedPathRow> = (a, b) =>
  (CLASS_ORDER[current(a.original).blockClass ?? "state"] ?? 5) -
  (CLASS_ORDER[current(b.original).blockClass ?? "state"] ?? 5);
const byStatus: SortFn<Features, ChangedPathRow> = (a, b) =>
  STATUS_ORDER[a.original.status] - STATUS_ORDER[b.original.status];
const byInput: SortFn<Features, ChangedPathRow> = (a, b) =>
  a.original.input < b.original.input ? -1 : a.original.input > b.original.input ? 1 : 0;

function ClassWord({ cls }: { cls: BlockClass | undefined }) {
  if (cls === undefined) return <span className="text-ink-600">?</span>;
  return (
    <span data-block-class={cls} className={BLOCK_CLASS_STYLE[cls]}>
      {BLOCK_CLASS_WORD[cls]}
    </span>
  );
}

const yesNo = (v: boolean | undefined) =>
  v === undefined ? <span className="text-ink-600">?</span> : <span>{v ? "yes" : "no"}</span>;

/**
 * One field, before → after. A field that did not change is written once; a side the path does
 * not exist on is a dash. The arrow is read out as "becomes".
 */
function BeforeAfter({
  row,
  field,
  show,
}: {
  row: ChangedPathRow;
  field: keyof PathSide;
  show: (side: PathSide) => ReactNode;
}) {
  const changed = row.changed.includes(field);
  if (row.status === "changed" && !changed && row.after) {
    return <span className="text-ink-400">{show(row.after)}</span>;
  }
  const dash = <span className="text-ink-600">—</span>;
  return (
    <span className={`inline-flex items-baseline gap-1.5 ${changed ? "font-medium" : ""}`}>
      <span className={row.after ? "opacity-70" : ""}>{row.before ? show(row.before) : dash}</span>
      <span aria-hidden className="text-ink-500">
        →
      </span>
      <span className="sr-only">becomes</span>
      <span>{row.after ? show(row.after) : dash}</span>
    </span>
  );
}

function buildColumns(exploreHref: (row: ChangedPathRow, side: "from" | "to") => string, from: string, to: string) {
  return col.columns([
    col.accessor((r) => r.input, {
      id: "input",
      header: "Input",
      sortFn: byInput,
      cell: (c) => {
        const r = c.row.original;
        return (
          <Link href={exploreHref(r, r.status === "removed" ? "from" : "to")} className="font-mono text-ink-100">
            {r.input}
          </Link>
        );
      },
    }),
    col.accessor((r) => r.status, {
      id: "status",
      header: "Status",
      sortFn: byStatus,
      cell: (c) => <StatusTag status={c.row.original.status} />,
    }),
    col.accessor((r) => current(r).blockClass ?? "state", {
      id: "blockClass",
      header: "Ending on block",
      sortFn: byClass,
      cell: (c) => (
        <BeforeAfter row={c.row.original} field="blockClass" show={(s) => <ClassWord cls={s.blockClass} />} />
      ),
    }),
    col.display({
      id: "onHit",
      header: "On hit",
      cell: (c) => (
        <BeforeAfter
          row={c.row.original}
          field="onHit"
          show={(s) => (s.onHit === undefined ? <span className="text-ink-600">?</span> : <Frames value={s.onHit} />)}
        />
      ),
    }),
    col.display({
      id: "naturalCombo",
      header: "Natural combo",
      cell: (c) => <BeforeAfter row={c.row.original} field="naturalCombo" show={(s) => yesNo(s.naturalCombo)} />,
    }),
    col.display({
      id: "jails",
      header: "Jails",
      cell: (c) => <BeforeAfter row={c.row.original} field="jails" show={(s) => yesNo(s.jails)} />,
    }),
    col.display({
      id: "explore",
      header: "Open in the Explorer",
      cell: (c) => {
        const r = c.row.original;
        return (
          <span className="flex gap-3">
            {r.before && (
              <Link href={exploreHref(r, "from")} aria-label={`${r.input} in ${from}`}>
                {from}
              </Link>
            )}
            {r.after && (
              <Link href={exploreHref(r, "to")} aria-label={`${r.input} in ${to}`}>
                {to}
              </Link>
            )}
          </span>
        );
      },
    }),
  ]);
}

const HEADER_HINT: Partial<Record<string, string>> = {
  blockClass: "The block class of the path's last step, before → after",
  onHit: "The outcome if the last hit lands, before → after",
  naturalCombo: "Every hit after the first is guaranteed once the previous one connects",
  jails: "On block, the defender is never free between hits",
};
const control = "rounded border border-ink-700 bg-ink-900 px-1.5 py-0.5 text-ink-100";

type StatusFilter = ChangedPathRow["status"] | "any";

/** Every path that changed between two Editions, sortable and filterable; each row opens the path in the Explorer. */
export function ChangedPathsTable({
  rows,
  total,
  from,
  to,
  exploreBase,
}: {
  rows: ChangedPathRow[];
  /** Changed paths in all, on every page. */
  total: number;
  from: EditionLink;
  to: EditionLink;
  /** The character's Explorer address, without the root. */
  exploreBase: string;
}) {
  const [status, setStatus] = useState<StatusFilter>("any");
  const [text, setText] = useState("");
  const [sorting, setSorting] = useState<SortingState>([]);

  const data = useMemo(() => {
    const needle = text.trim().toLowerCase();
    return rows.filter(
      (r) => (status === "any" || r.status === status) && (needle === "" || r.input.toLowerCase().includes(needle)),
    );
  }, [rows, status, text]);
  const columns = useMemo(
    () =>
      buildColumns(
        (r, side) =>
          `${exploreBase}/${encodeURIComponent(r.root)}?edition=${encodeURIComponent(side === "from" ? from.slug : to.slug)}&path=${encodeURIComponent(r.path)}`,
        from.name,
        to.name,
      ),
    [exploreBase, from, to],
  );
  const table = useTable({
    features,
    columns,
    data,
    getRowId: (r) => `${r.root} ${r.path}`,
    state: { sorting },
    onSortingChange: setSorting,
    enableMultiSort: false,
  });
  const shownRows = table.getRowModel().rows;
  const filtered = status !== "any" || text.trim() !== "";
  const clear = () => {
    setStatus("any");
    setText("");
  };

  return (
    <section aria-labelledby="changed-paths-title" className="space-y-2" data-testid="changed-paths">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="changed-paths-title" className="text-sm font-semibold tracking-wider text-ink-400 uppercase">
          Paths that changed
        </h2>
        <ShownCount shown={data.length} of={rows.length} testId="changed-paths-count">
          {total > rows.length && <> on this page ({total} in all)</>}
        </ShownCount>
      </div>
      <FilterForm label="Filter changed paths">
        <label className="flex items-center gap-2">
          <span className="text-ink-400">Status</span>
          <select value={status} onChange={(e) => setStatus(e.target.value as StatusFilter)} className={control}>
            <option value="any">any</option>
            <option value="changed">changed</option>
            <option value="added">new</option>
            <option value="removed">taken out</option>
          </select>
        </label>
        <label className="flex items-center gap-2">
          <span className="text-ink-400">Input contains</span>
          <input
            type="search"
            value={text}
            onChange={(e) => setText(e.target.value)}
            placeholder="e.g. 1,2"
            className={`${control} w-32 font-mono`}
          />
        </label>
        <button
          type="button"
          onClick={clear}
          disabled={!filtered}
          className="rounded border border-ink-700 px-2 py-0.5 text-xs text-ink-300 hover:border-ink-600 hover:text-ink-100 disabled:opacity-40"
        >
          Clear filters
        </button>
      </FilterForm>
      <div className="relative overflow-x-auto rounded-lg border border-ink-800 bg-ink-900">
        {shownRows.length === 0 ? (
          <NoRows message="No changed path matches these filters." onClear={clear} />
        ) : (
          <table className="min-w-full border-separate border-spacing-0 text-sm" aria-labelledby="changed-paths-title">
            <thead>
              {table.getHeaderGroups().map((group) => (
                <tr key={group.id}>
                  {group.headers.map((header) => {
                    const id = header.column.id;
                    return (
                      <SortableHeading
                        key={header.id}

                        column={header.column}

                        title={HEADER_HINT[id]}
                        className={`border-b border-ink-700 bg-ink-900 px-2 py-1.5 text-left text-xs font-medium whitespace-nowrap text-ink-400 ${id === "input" ? "sticky left-0 z-10" : ""}`}
                      >
                        <table.FlexRender header={header} />
                      </SortableHeading>
                    );
                  })}
                </tr>
              ))}
            </thead>
            <tbody>
              {shownRows.map((row) => (
                <tr key={row.id} data-status={row.original.status} className="hover:bg-ink-850">
                  {row.getAllCells().map((cell) => (
                    <td
                      key={cell.id}
                      data-field={cell.column.id}
                      className={`border-t border-ink-850 px-2 py-1 align-middle whitespace-nowrap ${cell.column.id === "input" ? "sticky left-0 bg-ink-900" : ""}`}
                    >
                      <FlexRender cell={cell} />
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </div>
    </section>
  );
}
