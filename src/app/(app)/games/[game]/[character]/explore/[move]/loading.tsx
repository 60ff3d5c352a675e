export default function Loading() {
  return (
    <div role="status" aria-live="polite" className="space-y-3 py-2">
      <span className="sr-only">Loading the Explorer…</span>
      <div className="h-6 w-64 animate-pulse rounded bg-ink-800" />
      <div className="h-[55vh] animate-pulse rounded-lg bg-ink-900" />
    </div>
  );
}
