export default function Loading() {
  return (
    <div role="status" aria-live="polite" className="space-y-3 py-4">
      <span className="sr-only">Loading the move list…</span>
      <div className="h-7 w-48 animate-pulse rounded bg-ink-800" />
      <div className="h-4 w-96 max-w-full animate-pulse rounded bg-ink-850" />
      <div className="h-64 animate-pulse rounded-lg bg-ink-900" />
    </div>
  );
}
