import type { FieldChange } from "@/lib/engine";
import { FIELD_LABEL, formatFieldValue } from "@/lib/changes";

export interface ItemChange {
  id: string;
  status: "added" | "removed" | "changed";
  /** What is entered (a move's notation), or null for a stance. */
  input: string | null;
  name: string | null;
  changes: FieldChange[];
}

const STATUS_WORD: Record<ItemChange["status"], string> = { added: "new", removed: "taken out", changed: "changed" };
const STATUS_STYLE: Record<ItemChange["status"], string> = {
  added: "border-block-plus/60 text-block-plus",
  removed: "border-block-punishable/60 text-block-punishable",
  changed: "border-ink-600 text-ink-200",
};

/** A status as a word in a frame of its colour: never the colour alone. */
export function StatusTag({ status }: { status: ItemChange["status"] }) {
  return (
    <span
      data-status={status}
      className={`inline-block rounded border px-1.5 py-px text-[11px] leading-4 whitespace-nowrap ${STATUS_STYLE[status]}`}
    >
      {STATUS_WORD[status]}
    </span>
  );
}

/** Moves (or links, or stances) that changed, each field old → new. Renders nothing when the list is empty. */
export function ItemChanges({ title, kindWord, items }: { title: string; kindWord: string; items: ItemChange[] }) {
  if (items.length === 0) return null;
  const id = `changes-${kindWord}`;
  return (
    <section aria-labelledby={id} className="space-y-2">
      <h2 id={id} className="text-sm font-semibold tracking-wider text-ink-400 uppercase">
        {title} <span className="font-mono font-normal text-ink-300">({items.length})</span>
      </h2>
      <ul className="divide-y divide-ink-850 rounded-lg border border-ink-800 bg-ink-900" data-testid={id}>
        {items.map((item) => (
          <li key={item.id} className="space-y-1 px-3 py-2" data-item={item.id}>
            <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
              {item.input !== null && <span className="font-mono text-ink-100">{item.input}</span>}
              {item.name && <span className="text-ink-300">{item.name}</span>}
              <StatusTag status={item.status} />
            </div>
            {item.changes.length > 0 && (
              <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-0.5 text-sm">
                {item.changes.map((c) => (
                  <div key={c.field} className="contents" data-field={c.field}>
                    <dt className="text-ink-400">{FIELD_LABEL[c.field] ?? c.field}</dt>
                    <dd className="font-mono break-words">
                      <span className="text-ink-400">{formatFieldValue(c.field, c.before)}</span>
                      <span aria-hidden className="text-ink-500 px-1.5">
                        →
                      </span>
                      <span className="sr-only"> becomes </span>
                      <span className="text-ink-100">{formatFieldValue(c.field, c.after)}</span>
                    </dd>
                  </div>
                ))}
              </dl>
            )}
          </li>
        ))}
      </ul>
    </section>
  );
}
