"use client";

import { useId, useState } from "react";
import { useBoardStore } from "@/components/providers/board-store-provider";
import { Explained } from "@/components/ui/explained";
import { BOARD_LIMITS, cellIsOverridden, type BoardCell, type BoardSituationDoc } from "@/lib/board";
import {
  bestReplyTo,
  cellPayoff,
  explainCell,
  formatPayoff,
  type SituationSolution,
  type ValueTable,
} from "@/lib/engine";
import { formatShare } from "./format";

const input =
  "rounded border border-ink-700 bg-ink-950 px-1.5 py-0.5 text-ink-100 focus-visible:outline-2 focus-visible:outline-accent";
const small =
  "rounded border border-ink-700 px-2 py-0.5 text-xs text-ink-200 hover:border-accent focus-visible:outline-2 focus-visible:outline-accent";

/** A cell's own payoff before any child situation: the coach's number, else the engine's, else 0. */
function ownPayoff(cell: BoardCell, values: ValueTable): number {
  if (cell.override !== null) return cell.override;
  return cell.basis ? cellPayoff(cell.basis, values) : 0;
}

/** A number field that commits while typing once the text reads as a payoff, and says why when it does not. */
function NumberField({
  label,
  value,
  onCommit,
  testId,
}: {
  label: string;
  value: number;
  onCommit: (x: number) => void;
  testId?: string;
}) {
  const [text, setText] = useState(String(value));
  const [problem, setProblem] = useState<string | null>(null);
  const id = useId();
  return (
    <span className="inline-flex flex-col">
      <label htmlFor={id} className="text-xs text-ink-400">
        {label}
      </label>
      <input
        id={id}
        inputMode="decimal"
        value={text}
        data-testid={testId}
        aria-invalid={problem !== null}
        aria-describedby={problem ? `${id}-problem` : undefined}
        className={`${input} w-28 font-mono`}
        onChange={(e) => {
          setText(e.target.value);
          const x = Number(e.target.value.trim().replace(/^\+/, ""));
          if (e.target.value.trim() === "" || !Number.isFinite(x)) {
            setProblem("Type a number, such as 12 or -8.5.");
          } else if (Math.abs(x) > BOARD_LIMITS.magnitude) {
            setProblem(`Keep it between -${BOARD_LIMITS.magnitude} and ${BOARD_LIMITS.magnitude}.`);
          } else {
            setProblem(null);
            onCommit(x);
          }
        }}
      />
      {problem && (
        <span id={`${id}-problem`} className="text-xs text-block-launch-punishable">
          {problem}
        </span>
      )}
    </span>
  );
}

function OptionName({
  value,
  label,
  canEdit,
  onChange,
  onRemove,
}: {
  value: string;
  label: string;
  canEdit: boolean;
  onChange: (v: string) => void;
  onRemove: (() => void) | null;
}) {
  if (!canEdit) return <span className="font-mono">{value}</span>;
  return (
    <span className="flex items-center gap-1">
      <input
        aria-label={label}
        value={value}
        maxLength={BOARD_LIMITS.label}
        onChange={(e) => onChange(e.target.value)}
        className={`${input} w-full min-w-20 font-mono text-xs`}
      />
      {onRemove && (
        <button
          type="button"
          onClick={onRemove}
          aria-label={`Remove ${value}`}
          className="px-1 text-ink-400 hover:text-ink-100"
        >
          ×
        </button>
      )}
    </span>
  );
}

function MixList({
  title,
  names,
  mix,
  shortfall,
  side,
}: {
  title: string;
  names: string[];
  mix: number[];
  shortfall: number[];
  side: "attacker" | "defender";
}) {
  return (
    <div>
      <h4 className="text-xs tracking-wider text-ink-400 uppercase">{title}</h4>
      <ul className="mt-1 space-y-1" data-testid={`${side}-mix`}>
        {names.map((name, i) => {
          const p = mix[i] ?? 0;
          const short = shortfall[i] ?? 0;
          return (
            <li key={i} className="grid grid-cols-[minmax(0,8rem)_minmax(0,1fr)_auto] items-center gap-2 text-sm">
              <span className="truncate font-mono text-ink-100">{name}</span>
              <span className="h-2 rounded bg-ink-800" aria-hidden>
                <span className="block h-2 rounded bg-accent" style={{ width: `${p * 100}%` }} />
              </span>
              <Explained
                field={`${side}-share`}
                explain={
                  p > 1e-9
                    ? `Played ${formatShare(p)} of the time in the mix neither side can exploit; against the other side's mix it earns exactly the value.`
                    : side === "attacker"
                      ? `Not played: against the defender's mix it earns ${Math.round(short * 100) / 100} less than the value. It still matters: were the defender to stop fearing it, their mix would change.`
                      : `Not played: against the attacker's mix it concedes ${Math.round(short * 100) / 100} more than the value.`
                }
              >
                <span className="font-mono text-xs text-ink-200">
                  {formatShare(p)}
                  {short > 1e-9 ? ` · −${Math.round(short * 100) / 100}` : ""}
                </span>
              </Explained>
            </li>
          );
        })}
      </ul>
    </div>
  );
}

/** What the attacker does best if the defender always picks one answer, and what it earns. */
function IfAlways({ situation, solution }: { situation: BoardSituationDoc; solution: SituationSolution }) {
  const [col, setCol] = useState(0);
  const id = useId();
  const chosen = Math.min(col, situation.cols.length - 1);
  const reply = bestReplyTo(solution, chosen);
  return (
    <div className="space-y-1 text-sm" data-testid="if-always">
      <label htmlFor={id} className="text-xs tracking-wider text-ink-400 uppercase">
        If the defender always picks
      </label>
      <select id={id} value={chosen} onChange={(e) => setCol(Number(e.target.value))} className={`${input} ml-2`}>
        {situation.cols.map((c, j) => (
          <option key={j} value={j}>
            {c}
          </option>
        ))}
      </select>
      <p className="text-ink-200">
        the attacker answers with <span className="font-mono text-ink-100">{situation.rows[reply.row]}</span> and earns{" "}
        <span className="font-mono text-accent">{formatPayoff(reply.payoff)}</span> a time, against{" "}
        <span className="font-mono">{formatPayoff(solution.value)}</span> when the defender mixes.
      </p>
    </div>
  );
}

function CellDetail({
  situation,
  row,
  col,
  solution,
  values,
  canEdit,
}: {
  situation: BoardSituationDoc;
  row: number;
  col: number;
  solution: SituationSolution | null;
  values: ValueTable;
  canEdit: boolean;
}) {
  const cell = situation.cells[row]?.[col];
  const situations = useBoardStore((s) => s.document.situations);
  const setCell = useBoardStore((s) => s.setCell);
  const addChild = useBoardStore((s) => s.addChild);
  const select = useBoardStore((s) => s.select);
  const id = useId();
  if (!cell) return null;
  const own = ownPayoff(cell, values);
  const child = cell.next ? situations.find((s) => s.id === cell.next) : undefined;
  const effective = solution?.cells[row]?.[col];
  return (
    <section
      aria-labelledby={`${id}-title`}
      className="space-y-2 rounded-md border border-ink-700 bg-ink-950 p-3 text-sm"
      data-testid="cell-detail"
    >
      <h4 id={`${id}-title`} className="text-ink-100">
        <span className="font-mono">{situation.rows[row]}</span> against{" "}
        <span className="font-mono">{situation.cols[col]}</span>
      </h4>
      <p className="text-ink-300" data-testid="cell-source">
        {cell.basis
          ? `From the engine: ${explainCell(cell.basis, values, situation.cols[col])}`
          : "Typed by hand: no path of the character stands behind this number."}
      </p>
      {cellIsOverridden(cell) && cell.basis && (
        <p className="text-accent">
          Overridden: the board uses {formatPayoff(cell.override!)} instead of the engine&apos;s{" "}
          {formatPayoff(cellPayoff(cell.basis, values))}.
        </p>
      )}
      {canEdit && (
        <div className="flex flex-wrap items-end gap-2">
          <NumberField
            key={`${situation.id}:${row}:${col}:${own}`}
            label="Payoff to the attacker"
            value={own}
            testId="cell-payoff"
            onCommit={(x) =>
              setCell(row, col, {
                override: cell.basis && cellPayoff(cell.basis, values) === x ? null : x,
              })
            }
          />
          {cellIsOverridden(cell) && cell.basis && (
            <button type="button" className={small} onClick={() => setCell(row, col, { override: null })}>
              Use the engine&apos;s number
            </button>
          )}
        </div>
      )}
      <div className="flex flex-wrap items-center gap-2">
        <label htmlFor={`${id}-next`} className="text-ink-400">
          Leads to
        </label>
        {canEdit ? (
          <select
            id={`${id}-next`}
            value={cell.next ?? ""}
            onChange={(e) => setCell(row, col, { next: e.target.value === "" ? null : e.target.value })}
            className={input}
          >
            <option value="">Nothing: the exchange ends here</option>
            {situations
              .filter((s) => s.id !== situation.id)
              .map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name}
                </option>
              ))}
          </select>
        ) : (
          <span className="text-ink-200">{child ? child.name : "nothing: the exchange ends here"}</span>
        )}
        {canEdit && situations.length < BOARD_LIMITS.situations && (
          <button type="button" className={small} onClick={() => addChild(row, col)}>
            New situation from here
          </button>
        )}
        {child && (
          <button type="button" className={small} onClick={() => select(child.id)}>
            Open {child.name}
          </button>
        )}
      </div>
      {effective !== undefined && (
        <p className="text-ink-300">
          Counts as <span className="font-mono text-accent">{formatPayoff(effective)}</span>
          {child
            ? ` : ${formatPayoff(own)} here plus ${formatPayoff(effective - own)}, the value of ${child.name}.`
            : "."}
        </p>
      )}
    </section>
  );
}

/** The selected situation: its matrix, a cell's story, both mixes, and the note a coach teaches with. */
export function SituationPanel({
  solution,
  canEdit,
}: {
  /** This situation's solution; null while the board cannot be solved. */
  solution: SituationSolution | null;
  canEdit: boolean;
}) {
  const document = useBoardStore((s) => s.document);
  const selected = useBoardStore((s) => s.selected);
  const cell = useBoardStore((s) => s.cell);
  const pickCell = useBoardStore((s) => s.pickCell);
  const editSituation = useBoardStore((s) => s.editSituation);
  const addOption = useBoardStore((s) => s.addOption);
  const removeOption = useBoardStore((s) => s.removeOption);
  const removeSituation = useBoardStore((s) => s.removeSituation);
  const noteId = useId();
  const situation = document.situations.find((s) => s.id === selected);
  if (!situation) return null;
  const rename = (side: "rows" | "cols", index: number, name: string) =>
    editSituation((s) => ({ ...s, [side]: s[side].map((x, k) => (k === index ? name : x)) }));

  return (
    <section aria-label={`Situation ${situation.name}`} className="space-y-4" data-testid="situation">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        {canEdit ? (
          <input
            aria-label="Situation name"
            value={situation.name}
            maxLength={BOARD_LIMITS.name}
            onChange={(e) => editSituation((s) => ({ ...s, name: e.target.value }))}
            className={`${input} min-w-0 flex-1 text-base`}
          />
        ) : (
          <h3 className="text-base font-semibold">{situation.name}</h3>
        )}
        {solution && (
          <Explained
            field="situation-value"
            explain="The value: what the attacker earns on average per exchange (damage dealt minus damage taken, plus what the position after it is worth) when both sides play the mixes below. Neither side can do better by changing alone."
          >
            <span className="text-sm text-ink-300">
              Value <span className="font-mono text-lg text-accent">{formatPayoff(solution.value)}</span>
            </span>
          </Explained>
        )}
      </div>

      <div className="overflow-x-auto">
        <table className="border-separate border-spacing-1 text-sm" data-testid="matrix">
          <caption className="text-left text-xs text-ink-400">
            Attacker options down, defender answers across; each cell is the attacker&apos;s payoff. ✎ marks a number
            typed over the engine&apos;s, → a cell that leads to another situation.
          </caption>
          <thead>
            <tr>
              <td />
              {situation.cols.map((c, j) => (
                <th key={j} scope="col" className="min-w-24 text-left font-normal text-ink-300">
                  <OptionName
                    value={c}
                    label={`Defender answer ${j + 1}`}
                    canEdit={canEdit}
                    onChange={(v) => rename("cols", j, v)}
                    onRemove={situation.cols.length > 1 ? () => removeOption("cols", j) : null}
                  />
                </th>
              ))}
              {canEdit && situation.cols.length < BOARD_LIMITS.options && (
                <td>
                  <button type="button" className={small} onClick={() => addOption("cols")}>
                    + Answer
                  </button>
                </td>
              )}
            </tr>
          </thead>
          <tbody>
            {situation.rows.map((r, i) => (
              <tr key={i}>
                <th scope="row" className="min-w-28 text-left font-normal text-ink-200">
                  <OptionName
                    value={r}
                    label={`Attacker option ${i + 1}`}
                    canEdit={canEdit}
                    onChange={(v) => rename("rows", i, v)}
                    onRemove={situation.rows.length > 1 ? () => removeOption("rows", i) : null}
                  />
                </th>
                {situation.cols.map((c, j) => {
                  const x = situation.cells[i]![j]!;
                  const shown = solution?.cells[i]?.[j] ?? ownPayoff(x, document.values);
                  const picked = cell !== null && cell[0] === i && cell[1] === j;
                  const overridden = cellIsOverridden(x) && x.basis !== null;
                  return (
                    <td key={j}>
                      <button
                        type="button"
                        aria-pressed={picked}
                        aria-label={`${r} against ${c}: ${formatPayoff(shown)}${overridden ? ", overridden" : ""}${x.next ? ", leads on" : ""}`}
                        data-cell={`${i}:${j}`}
                        data-row={r}
                        data-col={c}
                        data-overridden={overridden}
                        onClick={() => pickCell(picked ? null : [i, j])}
                        className={`w-full rounded border px-2 py-1 text-right font-mono ${
                          picked
                            ? "border-accent bg-ink-800"
                            : overridden
                              ? "border-dashed border-accent-muted"
                              : "border-ink-800"
                        } ${shown > 0 ? "text-block-plus" : shown < 0 ? "text-block-punishable" : "text-ink-200"}`}
                      >
                        {overridden && <span aria-hidden>✎ </span>}
                        {formatPayoff(shown)}
                        {x.next && <span aria-hidden> →</span>}
                      </button>
                    </td>
                  );
                })}
              </tr>
            ))}
            {canEdit && situation.rows.length < BOARD_LIMITS.options && (
              <tr>
                <td>
                  <button type="button" className={small} onClick={() => addOption("rows")}>
                    + Option
                  </button>
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>

      {cell && (
        <CellDetail
          situation={situation}
          row={cell[0]}
          col={cell[1]}
          solution={solution}
          values={document.values}
          canEdit={canEdit}
        />
      )}

      {solution && (
        <div className="grid gap-4 sm:grid-cols-2">
          <MixList
            title="Attacker's mix"
            names={situation.rows}
            mix={solution.row}
            shortfall={solution.rowShortfall}
            side="attacker"
          />
          <MixList
            title="Defender's mix"
            names={situation.cols}
            mix={solution.col}
            shortfall={solution.colShortfall}
            side="defender"
          />
        </div>
      )}
      {solution && <IfAlways situation={situation} solution={solution} />}

      <div className="space-y-1">
        <label htmlFor={noteId} className="text-xs tracking-wider text-ink-400 uppercase">
          Coach&apos;s note
        </label>
        {canEdit ? (
          <textarea
            id={noteId}
            value={situation.note}
            maxLength={BOARD_LIMITS.note}
            rows={3}
            placeholder="What to teach here: why the rare option matters, what to look for."
            onChange={(e) => editSituation((s) => ({ ...s, note: e.target.value }))}
            className={`${input} w-full`}
          />
        ) : (
          <p id={noteId} className="whitespace-pre-wrap text-ink-200" data-testid="note">
            {situation.note || "No note."}
          </p>
        )}
      </div>
      {canEdit && situation.id !== document.root && (
        <button type="button" className={small} onClick={() => removeSituation(situation.id)}>
          Remove this situation
        </button>
      )}
    </section>
  );
}
