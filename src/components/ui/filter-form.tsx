import type { ReactNode } from "react";

/** "12 of 40 paths" above a filtered table, read out when the filters change it. */
export function ShownCount({
  shown,
  of,
  testId,
  children,
}: {
  shown: number;
  of: number;
  testId: string;
  children?: ReactNode;
}) {
  return (
    <p className="text-xs text-ink-400" aria-live="polite" data-testid={testId}>
      <span className="font-mono text-ink-200">{shown}</span> of <span className="font-mono text-ink-200">{of}</span>{" "}
      paths
      {children}
    </p>
  );
}

/** A row of filter controls that apply as they change (there is nothing to submit). */
export function FilterForm({ label, children }: { label: string; children: ReactNode }) {
  return (
    <form
      aria-label={label}
      className="flex flex-wrap items-center gap-x-4 gap-y-2 text-sm"
      onSubmit={(e) => e.preventDefault()}
    >
      {children}
    </form>
  );
}

/** What a table shows when no row is left: why, and (when filters hid them) the way back. */
export function NoRows({ message, onClear }: { message: string; onClear?: () => void }) {
  return (
    <div className="flex flex-col items-start gap-2 p-4 text-sm text-ink-300" role="status">
      <p>{message}</p>
      {onClear && (
        <button
          type="button"
          onClick={onClear}
          className="rounded border border-accent-muted px-2 py-0.5 text-xs text-accent hover:border-accent"
        >
          Clear filters
        </button>
      )}
    </div>
  );
}

/** The button that puts every filter of a table back; off while nothing filters. */
export function ClearFilters({ onClear, filtered }: { onClear: () => void; filtered: boolean }) {
  return (
    <button
      type="button"
      onClick={onClear}
      disabled={!filtered}
      className="rounded border border-ink-700 px-2 py-0.5 text-xs text-ink-300 hover:border-ink-600 hover:text-ink-100 disabled:opacity-40"
    >
      Clear filters
    </button>
  );
}
