"use client";

import { useId, useState } from "react";
import { useBoardStore } from "@/components/providers/board-store-provider";
import { BOARD_LIMITS } from "@/lib/board";
import { DEFAULT_VALUE_TABLE, type StateName, type ValueTable } from "@/lib/engine";

const ROWS: { key: "plusFrame" | "minusFrame" | "whiff" | StateName; label: string; explain: string }[] = [
  {
    key: "plusFrame",
    label: "Each frame ahead",
    explain: "An ending at +N is worth N times this to the attacker: the turn they keep.",
  },
  {
    key: "minusFrame",
    label: "Each frame behind",
    explain:
      "An ending at −N costs N times this when no punisher of the opponent is fast enough (with one, its damage counts instead).",
  },
  { key: "knockdown", label: "Knockdown", explain: "Added to a hit that knocks the defender down." },
  { key: "launch", label: "Launch", explain: "Added to a hit that launches: the combo that follows." },
  { key: "wall-splat", label: "Wall splat", explain: "Added to a hit that sticks the defender to a wall." },
  { key: "crumple", label: "Crumple", explain: "Added to a hit that crumples the defender." },
  { key: "throw", label: "Throw state", explain: "Added to a hit that ends in a throw's own state." },
  {
    key: "whiff",
    label: "A ducked high",
    explain: "What a whiffed high costs the attacker: the defender's free answer.",
  },
];

function read(values: ValueTable, key: (typeof ROWS)[number]["key"]): number {
  if (key === "plusFrame" || key === "minusFrame" || key === "whiff") return values[key];
  return values.states[key];
}

function write(values: ValueTable, key: (typeof ROWS)[number]["key"], x: number): ValueTable {
  if (key === "plusFrame" || key === "minusFrame" || key === "whiff") return { ...values, [key]: x };
  return { ...values, states: { ...values.states, [key]: x } };
}

function ValueRow({
  row,
  values,
  canEdit,
  onChange,
}: {
  row: (typeof ROWS)[number];
  values: ValueTable;
  canEdit: boolean;
  onChange: (v: ValueTable) => void;
}) {
  const id = useId();
  const [text, setText] = useState(String(read(values, row.key)));
  const [problem, setProblem] = useState<string | null>(null);
  return (
    <tr>
      <th scope="row" className="py-1 pr-2 text-left font-normal">
        <label htmlFor={id} className="text-ink-100">
          {row.label}
        </label>
        <p id={`${id}-explain`} className="text-xs text-ink-400">
          {row.explain} Framefork&apos;s default: {read(DEFAULT_VALUE_TABLE, row.key)}.
        </p>
      </th>
      <td className="py-1 align-top">
        {canEdit ? (
          <>
            <input
              id={id}
              inputMode="decimal"
              value={text}
              aria-describedby={`${id}-explain`}
              aria-invalid={problem !== null}
              onChange={(e) => {
                setText(e.target.value);
                const x = Number(e.target.value.trim());
                if (e.target.value.trim() === "" || !Number.isFinite(x) || Math.abs(x) > BOARD_LIMITS.magnitude) {
                  setProblem("Type a number, such as 2 or 0.5.");
                } else {
                  setProblem(null);
                  onChange(write(values, row.key, x));
                }
              }}
              className="w-20 rounded border border-ink-700 bg-ink-950 px-1.5 py-0.5 font-mono text-ink-100"
            />
            {problem && <p className="text-xs text-block-launch-punishable">{problem}</p>}
          </>
        ) : (
          <span id={id} className="font-mono">
            {read(values, row.key)}
          </span>
        )}
      </td>
    </tr>
  );
}

/**
 * The board's value table: what frames and states are worth in damage points. Every cell
 * the engine filled is valued through it, so changing a row changes those cells (not the
 * ones a coach typed over).
 */
export function ValueTableForm({ canEdit }: { canEdit: boolean }) {
  const values = useBoardStore((s) => s.document.values);
  const setValues = useBoardStore((s) => s.setValues);
  // A new key after "Back to the defaults" starts every field from the new numbers.
  const [round, setRound] = useState(0);
  return (
    <details className="rounded-lg border border-ink-800 bg-ink-900 p-3 text-sm" data-testid="value-table">
      <summary className="cursor-pointer text-ink-100">What frames and states are worth</summary>
      <p className="mt-2 text-ink-300">
        Payoffs are in damage points to the attacker. A filled cell is its hit&apos;s damage, or minus the
        punisher&apos;s, plus what the ending is worth by this table; cells typed by hand keep their number.
      </p>
      <table className="mt-2 w-full" key={round}>
        <tbody>
          {ROWS.map((row) => (
            <ValueRow key={row.key} row={row} values={values} canEdit={canEdit} onChange={setValues} />
          ))}
        </tbody>
      </table>
      {canEdit && (
        <button
          type="button"
          className="mt-2 rounded border border-ink-700 px-2 py-0.5 text-xs text-ink-200 hover:border-accent"
          onClick={() => {
            setValues(DEFAULT_VALUE_TABLE);
            setRound((r) => r + 1);
          }}
        >
          Back to the defaults
        </button>
      )}
    </details>
  );
}
