"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useEffect, useMemo, useState, useTransition, type ReactNode } from "react";
import {
  createColumnHelper,
  rowSortingFeature,
  tableFeatures,
  useTable,
  FlexRender,
  type SortingState,
  type Updater,
} from "@tanstack/react-table";
import { ClearFilters, NoRows, ShownCount } from "@/components/ui/filter-form";
import { SortableHeading } from "@/components/ui/sort-button";
import { BLOCK_CLASS_STYLE } from "@/components/ui/block-class";
import { Frames } from "@/components/ui/frames";
import { BLOCK_CLASS_WORD, type BlockClass } from "@/lib/engine";
import {
  changesSearch,
  currentSide,
  SORT_COLUMNS,
  type ChangedPathRow,
  type ChangedPathsView,
  type ChangeFilter,
  type PathSide,
  type SortColumn,
} from "@/lib/changes";
import { StatusTag } from "./item-changes";

interface EditionLink {
  slug: string;
  name: string;
}

/**
 * Sorting state only: the server sorts and filters every changed path (the page's view is in
 * the address), so the table shows the rows it is given in the order given.
 */
const features = tableFeatures({ rowSortingFeature });
type Features = typeof features;
const col = createColumnHelper<Features, ChangedPathRow>();

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
      cell: (c) => <StatusTag status={c.row.original.status} />,
    }),
    col.accessor((r) => currentSide(r).blockClass, {
      id: "blockClass",
      header: "Ending on block",
      cell: (c) => (
        <BeforeAfter row={c.row.original} field="blockClass" show={(s) => <ClassWord cls={s.blockClass} />} />
      ),
    }),
    col.accessor((r) => currentSide(r).onHit, {
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
    col.accessor((r) => currentSide(r).naturalCombo, {
      id: "naturalCombo",
      header: "Natural combo",
      cell: (c) => <BeforeAfter row={c.row.original} field="naturalCombo" show={(s) => yesNo(s.naturalCombo)} />,
    }),
    col.accessor((r) => currentSide(r).jails, {
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

const CHANGE_WORDS: Record<ChangeFilter, string> = {
  any: "any",
  blockClass: "ending on block",
  onHit: "outcome on hit",
  naturalCombo: "natural combo",
  jails: "jails",
  oneSide: "new or taken out",
  added: "new",
  removed: "taken out",
};

const isSortColumn = (id: string | undefined): id is SortColumn => SORT_COLUMNS.some((c) => c === id);

/**
 * Every path that changed between two Editions, a page at a time; each row opens the path in
 * the Explorer. The filters and the sort apply to every changed path, not only this page's:
 * they change the address, and the server answers with the first page of the result.
 */
export function ChangedPathsTable({
  rows,
  total,
  matching,
  firstRow,
  view,
  address,
  from,
  to,
  exploreBase,
}: {
  /** The page's rows, filtered and sorted. */
  rows: ChangedPathRow[];
  /** Changed paths in all. */
  total: number;
  /** Changed paths the filters keep, on every page. */
  matching: number;
  /** The position of the page's first row among those kept, from 1. */
  firstRow: number;
  view: ChangedPathsView;
  /** The page's address, without its search. */
  address: string;
  from: EditionLink;
  to: EditionLink;
  /** The character's Explorer address, without the root. */
  exploreBase: string;
}) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  // What is picked or typed shows at once; the address (and so the rows) follows it.
  const [change, setChange] = useState(view.change);
  const [text, setText] = useState(view.q);
  const [seen, setSeen] = useState({ change: view.change, q: view.q });
  if (view.change !== seen.change || view.q !== seen.q) {
    // The address changed (the rows arrived, or back, or Clear filters): the controls follow it.
    setSeen({ change: view.change, q: view.q });
    setChange(view.change);
    setText(view.q);
  }

  const go = (next: Partial<ChangedPathsView>, how: "push" | "replace" = "push") => {
    // Any change of filter or order starts again at the first page.
    const search = changesSearch({ from: from.slug, to: to.slug }, { ...view, page: 1, ...next });
    startTransition(() => router[how](`${address}${search}`, { scroll: false }));
  };

  useEffect(() => {
    if (text.trim() === view.q.trim()) return;
    const timer = setTimeout(() => go({ change, q: text.trim() }, "replace"), 300);
    return () => clearTimeout(timer);
    // `go` reads the view, which changes with it: only typing starts the wait.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [text]);

  const sorting: SortingState = useMemo(
    () => (view.sort === null ? [] : [{ id: view.sort, desc: view.dir === "desc" }]),
    [view.sort, view.dir],
  );
  const onSortingChange = (updater: Updater<SortingState>) => {
    const next = typeof updater === "function" ? updater(sorting) : updater;
    const first = next[0];
    go(isSortColumn(first?.id) ? { sort: first.id, dir: first.desc ? "desc" : "asc" } : { sort: null, dir: "asc" });
  };
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
    data: rows,
    getRowId: (r) => `${r.root} ${r.path}`,
    state: { sorting },
    onSortingChange,
    manualSorting: true,
    sortDescFirst: false,
    enableMultiSort: false,
  });
  const shownRows = table.getRowModel().rows;
  const filtered = view.change !== "any" || view.q !== "";
  const clear = () => {
    setChange("any");
    setText("");
    go({ change: "any", q: "" });
  };

  return (
    <section aria-labelledby="changed-paths-title" className="space-y-2" data-testid="changed-paths">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="changed-paths-title" className="text-sm font-semibold tracking-wider text-ink-400 uppercase">
          Paths that changed
        </h2>
        <ShownCount shown={matching} of={total} testId="changed-paths-count">
          {matching > rows.length && rows.length > 0 && (
            <>
              {" "}
              (showing {firstRow}–{firstRow + rows.length - 1})
            </>
          )}
          {pending && <span className="text-ink-500 ml-2">updating…</span>}
        </ShownCount>
      </div>
      {/* A GET form: without script, Apply loads the filtered address; with it, the filters apply as they change. */}
      <form
        method="get"
        action={address}
        aria-label="Filter changed paths"
        className="flex flex-wrap items-center gap-x-4 gap-y-2 text-sm"
        onSubmit={(e) => {
          e.preventDefault();
          go({ change, q: text.trim() });
        }}
      >
        <input type="hidden" name="from" value={from.slug} />
        <input type="hidden" name="to" value={to.slug} />
        {view.sort !== null && <input type="hidden" name="sort" value={view.sort} />}
        {view.sort !== null && <input type="hidden" name="dir" value={view.dir} />}
        <label className="flex items-center gap-2">
          <span className="text-ink-400">Change</span>
          <select
            name="change"
            value={change}
            onChange={(e) => {
              const picked = e.target.value as ChangeFilter;
              setChange(picked);
              go({ change: picked, q: text.trim() });
            }}
            className={control}
          >
            {Object.entries(CHANGE_WORDS).map(([value, word]) => (
              <option key={value} value={value}>
                {word}
              </option>
            ))}
          </select>
        </label>
        <label className="flex items-center gap-2">
          <span className="text-ink-400">Input contains</span>
          <input
            type="search"
            name="q"
            value={text}
            maxLength={100}
            onChange={(e) => setText(e.target.value)}
            placeholder="e.g. n.v"
            className={`${control} w-32 font-mono`}
          />
        </label>
        <button
          type="submit"
          className="rounded border border-ink-700 px-2 py-0.5 text-xs text-ink-300 hover:border-ink-600 hover:text-ink-100"
        >
          Apply
        </button>
        <ClearFilters onClear={clear} filtered={filtered} />
      </form>
      <div
        className="relative overflow-x-auto rounded-lg border border-ink-800 bg-ink-900"
        aria-busy={pending}
        data-pending={pending ? "" : undefined}
      >
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
                      className={`path-cell ${cell.column.id === "input" ? "sticky left-0 bg-ink-900" : ""}`}
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
