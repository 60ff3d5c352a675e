/** While the two Editions are read and compared: the summary's box and the table's, in outline. */
export default function Loading() {
  return (
    <div role="status" aria-live="polite" className="space-y-3 py-4">
      <span className="sr-only">Comparing the Editions…</span>
      {["h-7 w-64 rounded bg-ink-800", "h-16 rounded-lg bg-ink-900", "h-64 rounded-lg bg-ink-900"].map((shape) => (
        <div key={shape} className={`animate-pulse ${shape}`} />
      ))}
    </div>
  );
}
