/**
 * Two selects and a button: a plain GET form, so the comparison is an address (a reload or a
 * shared link opens it) and works with the keyboard and without script.
 */
export function EditionPicker({
  editions,
  from,
  to,
}: {
  editions: { slug: string; name: string; draft: boolean }[];
  from: string;
  to: string;
}) {
  const control = "rounded border border-ink-700 bg-ink-900 px-2 py-1 text-ink-100";
  const options = editions.map((e) => (
    <option key={e.slug} value={e.slug}>
      {e.name}
      {e.draft ? " (draft)" : ""}
    </option>
  ));
  return (
    <form method="get" aria-label="Editions to compare" className="flex flex-wrap items-end gap-3 text-sm">
      {(
        [
          ["from", "From Edition", from],
          ["to", "To Edition", to],
        ] as const
      ).map(([name, label, value]) => (
        <label key={name} className="flex flex-col gap-1">
          <span className="text-ink-400">{label}</span>
          <select name={name} defaultValue={value} className={control}>
            {options}
          </select>
        </label>
      ))}
      <button
        type="submit"
        className="rounded border border-accent-muted px-3 py-1 text-accent hover:border-accent focus-visible:outline focus-visible:outline-2 focus-visible:outline-accent"
      >
        Compare
      </button>
    </form>
  );
}
