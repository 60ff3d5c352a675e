import type { ReactNode } from "react";

const ARIA_SORT = { asc: "ascending", desc: "descending" } as const;
const ARROW = { asc: "▲", desc: "▼" } as const;

/** What a heading needs of a TanStack column to sort by it. */
interface SortableColumn {
  getIsSorted: () => false | "asc" | "desc";
  getCanSort: () => boolean;
  getToggleSortingHandler: () => ((event: unknown) => void) | undefined;
}

/**
 * A column heading: for a sortable column, a button with the heading and an arrow for the order,
 * and `aria-sort` on the cell; otherwise the heading alone.
 */
export function SortableHeading({
  column,
  title,
  className,
  colSpan,
  children,
}: {
  column: SortableColumn;
  title?: string;
  className: string;
  colSpan?: number;
  children: ReactNode;
}) {
  const sorted = column.getIsSorted();
  const canSort = column.getCanSort();
  return (
    <th
      scope="col"
      colSpan={colSpan}
      aria-sort={canSort ? (sorted ? ARIA_SORT[sorted] : "none") : undefined}
      title={title}
      className={className}
    >
      {canSort ? (
        <button
          type="button"
          onClick={column.getToggleSortingHandler()}
          className={`inline-flex items-center gap-1 rounded hover:text-ink-100 focus-visible:outline focus-visible:outline-1 focus-visible:outline-accent ${sorted ? "text-ink-100" : ""}`}
        >
          {children}
          <span aria-hidden="true" className={sorted ? "text-accent" : "text-ink-600"}>
            {sorted ? ARROW[sorted] : "↕"}
          </span>
        </button>
      ) : (
        children
      )}
    </th>
  );
}
