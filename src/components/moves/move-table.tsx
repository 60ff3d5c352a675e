"use client";

import Link from "next/link";
import { usePathname, useSearchParams } from "next/navigation";
import { Fragment, useMemo, useState, type ReactNode } from "react";
import type { MoveEntry, MoveList } from "@/lib/dto";
import { BLOCK_CLASS_STYLE, BlockClassTag, type BlockRules } from "@/components/ui/block-class";
import { ClearFilters, NoRows } from "@/components/ui/filter-form";
import { Frames } from "@/components/ui/frames";
import { LevelBadge } from "@/components/ui/level-badge";
import { DistanceInput, useFollowedText } from "@/components/ui/number-field";
import { SortableHeading } from "@/components/ui/sort-button";
import type { QuickField } from "@/lib/edit-forms";
import {
  BLOCK_CLASS_WORD,
  blockClassMeaning,
  blockClassRange,
  explainFramesSaved,
  explainGap,
  explainOnBlock,
  explainOnHit,
  explainRange,
  formatRange,
  framesSavedLabel,
  gapJails,
  LEVELS,
  type RangeScale,
} from "@/lib/engine";
import {
  DEFAULT_MOVE_LIST_VIEW,
  endingLabel,
  hasMoveListFilters,
  moveListSearch,
  NEUTRAL_SECTION,
  readMoveListView,
  stanceSection,
  stringRows,
  viewStrings,
  type CancelStep,
  type HitStep,
  type MoveListSort,
  type MoveListView,
  type StringRow,
} from "@/lib/move-list";
import { BLOCK_CLASSES } from "@/lib/paths-filter";
import { stanceSheetHref } from "@/lib/permalink";
import { QuickFix } from "./quick-fix";

interface Section {
  id: string;
  title: string;
  note: string | null;
  /** The stance the section's strings are done from (none for neutral). */
  stance?: { key: string; name: string };
}

function sectionsOf(list: MoveList): Section[] {
  return [
    { id: NEUTRAL_SECTION, title: "Neutral", note: null },
    ...list.stances.map((s) => ({
      id: stanceSection(s.key),
      title: `From ${s.name} (${s.abbreviation})`,
      note: s.notes,
      stance: { key: s.key, name: s.name },
    })),
  ];
}

const th = "px-2 py-2 text-left text-xs font-medium text-ink-400";
const td = "move-cell";
/** Startup and damage have their own columns from a tablet up; on a phone they sit under the input. */
const wide = "hidden sm:table-cell";
const control = "rounded border border-ink-700 bg-ink-900 px-1.5 py-0.5 text-ink-100";

const ORDERS: readonly (readonly [string, string])[] = [
  ["list", "the list's order"],
  ["startup asc", "fastest first"],
  ["startup desc", "slowest first"],
  ["damage desc", "most damage first"],
  ["damage asc", "least damage first"],
  ["ending asc", "best ending first"],
  ["ending desc", "worst ending first"],
];

/** A labelled select of the filter row. */
function Choice({
  label,
  value,
  onChange,
  options,
}: {
  label: string;
  value: string;
  onChange: (value: string) => void;
  options: readonly (readonly [string, string])[];
}) {
  return (
    <label className="flex flex-col gap-1">
      <span className="text-xs text-ink-400">{label}</span>
      <select value={value} onChange={(e) => onChange(e.target.value)} className={control}>
        {options.map(([v, word]) => (
          <option key={v} value={v}>
            {word}
          </option>
        ))}
      </select>
    </label>
  );
}

/**
 * A character's move list as strings: one row per first hit with its hits as level chips and its
 * endings summed up by block class; a row opens into its steps, each showing only what it adds
 * (a hit with the gap or jail before it, or a cancel with the frames it saves) and how stopping
 * there leaves you. Filters and order live in the address.
 */
export function MoveTable(props: MoveTableProps) {
  const params = useSearchParams();
  return <MoveTableView {...props} search={params.toString()} />;
}

interface MoveTableProps {
  list: MoveList;
  rules: BlockRules;
  /** How the game measures range: with numbers, the list filters by what reaches a distance. */
  range: RangeScale;
  /** The character's Explorer address, without the move. */
  exploreBase: string;
  /** Where the character's stance sheets are: each stance section links to its own. */
  stanceSheets?: { gameSlug: string; characterSlug: string };
  edition: string;
  /** For a coach on a draft: the moves' address under the edit routes; numbers are then fixed in place. */
  editBase: string | null;
}

/**
 * The move list for a given query string. A page served from the cache renders it with no
 * query (the list as it comes) while the browser reads the address; see MoveTable.
 */
export function MoveTableView({
  search,
  list,
  rules,
  exploreBase,
  stanceSheets,
  edition,
  editBase,
  range,
  ready = true,
}: MoveTableProps & {
  search: string;
  /** False while a cached page shows the list before the browser has read its address. */
  ready?: boolean;
}) {
  const pathname = usePathname();
  const view = readMoveListView(new URLSearchParams(search));
  const rows = useMemo(() => stringRows(list, rules), [list, rules]);
  const shown = viewStrings(rows, view);
  const [open, setOpen] = useState<ReadonlySet<string>>(new Set());
  const sections = sectionsOf(list).filter((s) => rows.some((r) => r.section === s.id));
  const filtered = hasMoveListFilters(view);

  // The address keeps the view (a reload or a shared link opens the same list); Next keeps
  // useSearchParams in step with the history API without asking the server again.
  const go = (next: Partial<MoveListView>) => {
    const address = moveListSearch(new URLSearchParams(search), { ...view, ...next });
    window.history.pushState(null, "", `${pathname}${address}`);
  };
  const toggleSort = (id: Exclude<MoveListSort, "list">) => {
    if (view.sort !== id) go({ sort: id, dir: id === "damage" ? "desc" : "asc" });
    else if (view.dir === (id === "damage" ? "desc" : "asc")) go({ dir: id === "damage" ? "asc" : "desc" });
    else go({ sort: "list", dir: "asc" });
  };
  const sortColumn = (id: Exclude<MoveListSort, "list">) => ({
    getIsSorted: () => (view.sort === id ? view.dir : false),
    getCanSort: () => true,
    getToggleSortingHandler: () => () => toggleSort(id),
  });
  const allOpen = shown.length > 0 && shown.every((r) => open.has(r.root.key));
  const clear = () => go({ ...DEFAULT_MOVE_LIST_VIEW, sort: view.sort, dir: view.dir });

  return (
    <div className="space-y-6">
      <form
        aria-label="Filter and order the strings"
        className="flex flex-wrap items-end gap-x-4 gap-y-2 text-sm"
        onSubmit={(e) => e.preventDefault()}
      >
        {/* Inert until the address is read (see `ready`): a value typed earlier would be lost. */}
        <fieldset disabled={!ready} className="contents">
          <Choice
            label="A hit that is"
            value={view.level}
            onChange={(v) => go({ level: v as MoveListView["level"] })}
            options={[["any", "any level"], ...LEVELS.map((l) => [l, l] as const)]}
          />
          <Choice
            label="An ending that is"
            value={view.ending}
            onChange={(v) => go({ ending: v as MoveListView["ending"] })}
            options={[["any", "any block class"], ...BLOCK_CLASSES.map((c) => [c, BLOCK_CLASS_WORD[c]] as const)]}
          />
          {list.stances.length > 0 && (
            <Choice
              label="Done from"
              value={view.stance}
              onChange={(v) => go({ stance: v })}
              options={[
                ["any", "anywhere"],
                [NEUTRAL_SECTION, "neutral"],
                ...list.stances.map((st) => [st.key, st.name] as const),
              ]}
            />
          )}
          <fieldset className="flex flex-col gap-1">
            <legend className="text-xs text-ink-400">First hit&apos;s startup</legend>
            <span className="flex items-center gap-1">
              <StartupInput label="Startup from" value={view.startupFrom} onChange={(n) => go({ startupFrom: n })} />
              <span className="text-ink-400">to</span>
              <StartupInput label="Startup to" value={view.startupTo} onChange={(n) => go({ startupTo: n })} />
            </span>
          </fieldset>
          {range.kind === "number" && (
            <DistanceInput
              stacked
              label="First hit reaches at"
              title="Only strings whose first hit connects at this distance"
              unit={range.unit}
              value={view.reach}
              onChange={(d) => go({ reach: d })}
            />
          )}
          <Choice
            label="Order"
            value={view.sort === "list" ? "list" : `${view.sort} ${view.dir}`}
            onChange={(v) => {
              const [sort, dir] = v.split(" ") as [MoveListSort, MoveListView["dir"] | undefined];
              go({ sort, dir: dir ?? "asc" });
            }}
            options={ORDERS}
          />
          <ClearFilters onClear={clear} filtered={filtered} />
        </fieldset>
      </form>

      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-xs text-ink-400" aria-live="polite" data-testid="strings-count">
          <span className="font-mono text-ink-200">{shown.length}</span> of{" "}
          <span className="font-mono text-ink-200">{rows.length}</span> strings
        </p>
        {shown.length > 0 && (
          <button
            type="button"
            onClick={() => setOpen(allOpen ? new Set() : new Set(shown.map((r) => r.root.key)))}
            className="rounded border border-ink-700 px-2 py-0.5 text-xs text-ink-300 hover:border-ink-600 hover:text-ink-100"
          >
            {allOpen ? "Close every string" : "Open every string"}
          </button>
        )}
      </div>

      {shown.length === 0 ? (
        <div className="rounded-lg border border-dashed border-ink-700">
          <NoRows message="No string matches these filters." onClear={clear} />
        </div>
      ) : (
        sections.map((section) => {
          const inSection = shown.filter((r) => r.section === section.id);
          if (inSection.length === 0) return null;
          return (
            <section key={section.id} aria-labelledby={section.id} className="space-y-2">
              <h2 id={section.id} className="text-sm font-semibold tracking-wider text-ink-400 uppercase">
                {section.title}
              </h2>
              {section.note && <p className="text-sm text-ink-300">{section.note}</p>}
              {section.stance && stanceSheets && (
                <p className="text-sm">
                  <Link href={stanceSheetHref({ ...stanceSheets, edition, stance: section.stance.key })}>
                    Every way into {section.stance.name} and what follows it →
                  </Link>
                </p>
              )}
              <div className="overflow-x-auto rounded-lg border border-ink-800">
                <table className="w-full text-sm" aria-labelledby={section.id}>
                  <thead className="bg-ink-900">
                    <tr>
                      <th scope="col" className={th}>
                        String
                      </th>
                      <th scope="col" className={th} title="The hit levels along the string, first to last">
                        Hits
                      </th>
                      <SortableHeading
                        column={sortColumn("ending")}
                        className={th}
                        title="How each place you can stop or cancel leaves you on block, counted by block class"
                      >
                        On block
                      </SortableHeading>
                      <SortableHeading column={sortColumn("startup")} className={`${th} ${wide}`}>
                        Startup
                      </SortableHeading>
                      <SortableHeading
                        column={sortColumn("damage")}
                        className={`${th} ${wide}`}
                        title="The most damage one way through the string deals; a step's own damage"
                      >
                        Damage
                      </SortableHeading>
                    </tr>
                  </thead>
                  {inSection.map((row, i) => (
                    <StringRows
                      key={row.root.id}
                      id={`${section.id}-${i}`}
                      row={row}
                      rules={rules}
                      open={open.has(row.root.key)}
                      onToggle={() => {
                        const next = new Set(open);
                        if (next.has(row.root.key)) next.delete(row.root.key);
                        else next.add(row.root.key);
                        setOpen(next);
                      }}
                      exploreHref={`${exploreBase}/${encodeURIComponent(row.root.key)}?edition=${edition}`}
                      editBase={editBase}
                      range={range}
                    />
                  ))}
                </table>
              </div>
            </section>
          );
        })
      )}
    </div>
  );
}

function StartupInput({
  label,
  value,
  onChange,
}: {
  label: string;
  value: number | null;
  onChange: (n: number | null) => void;
}) {
  const [text, setText] = useFollowedText(value);
  return (
    <input
      type="number"
      inputMode="numeric"
      min={0}
      max={999}
      aria-label={label}
      value={text}
      onChange={(e) => {
        setText(e.target.value);
        const n = e.target.value === "" ? null : Number(e.target.value);
        if (n === null || (Number.isInteger(n) && n >= 0 && n <= 999)) onChange(n);
      }}
      className={`${control} w-16 font-mono`}
    />
  );
}

/** The string's endings by class: "1 plus · 3 safe · 1 safe via cancel". */
function EndingSummary({ row, rules }: { row: StringRow; rules: BlockRules }) {
  return (
    <ul className="flex flex-wrap gap-x-2 gap-y-0.5" aria-label={`Endings of ${row.root.input}`}>
      {row.endings.map((e) => (
        <li
          key={`${e.blockClass} ${e.viaCancel}`}
          data-block-class={e.blockClass}
          data-via-cancel={e.viaCancel ? "" : undefined}
          className={`text-xs ${BLOCK_CLASS_STYLE[e.blockClass]}`}
          title={`${BLOCK_CLASS_WORD[e.blockClass]} (${blockClassRange(e.blockClass, rules)}): ${blockClassMeaning(e.blockClass, rules)}`}
        >
          {endingLabel(e, BLOCK_CLASS_WORD[e.blockClass])}
        </li>
      ))}
    </ul>
  );
}

function StringRows({
  id,
  row,
  rules,
  open,
  onToggle,
  exploreHref,
  editBase,
  range,
}: {
  id: string;
  row: StringRow;
  rules: BlockRules;
  open: boolean;
  onToggle: () => void;
  exploreHref: string;
  editBase: string | null;
  range: RangeScale;
}) {
  const { root } = row;
  const branches = row.steps.filter((s) => s.kind === "hit").length - row.mainLine.length;
  const cancels = row.steps.filter((s) => s.kind === "cancel").length;
  return (
    <tbody
      className="border-t border-ink-800"
      data-string={root.key}
      data-steps={row.steps.map((s) => (s.kind === "hit" ? s.move.key : s.cancel.key)).join(" ")}
    >
      <tr data-string-key={root.key} className="hover:bg-ink-900">
        <th scope="row" className={`${td} text-left font-normal`}>
          <span className="flex items-start gap-1.5">
            <button
              type="button"
              aria-expanded={open}
              aria-controls={open ? row.steps.map((_, n) => `${id}-${n}`).join(" ") : undefined}
              aria-label={`Steps of ${root.input}`}
              onClick={onToggle}
              className="steps-toggle"
            >
              <span aria-hidden="true">{open ? "▾" : "▸"}</span>
            </button>
            <span className="min-w-0">
              <Link href={exploreHref} className="string-link" title={`Open ${root.input} in the Explorer`}>
                {root.input}
              </Link>
              <span className="block text-xs text-ink-400">{root.name}</span>
              <Reach move={root} range={range} />
              <span className="block text-xs text-ink-400 sm:hidden">
                startup {root.startup ?? "—"} · up to {row.bestDamage} damage
              </span>
            </span>
          </span>
        </th>
        <td className={td}>
          <span className="flex flex-wrap items-center gap-1" data-field="levels">
            {row.mainLine.map((m) => (
              <LevelBadge key={m.id} level={m.level} />
            ))}
          </span>
          {(branches > 0 || cancels > 0) && (
            <span className="mt-0.5 block text-[11px] text-ink-400">
              {[
                branches > 0 ? `${branches} more ${branches === 1 ? "branch" : "branches"}` : null,
                cancels > 0 ? `${cancels} ${cancels === 1 ? "cancel" : "cancels"}` : null,
              ]
                .filter(Boolean)
                .join(" · ")}
            </span>
          )}
        </td>
        <td className={td} data-field="endings">
          <EndingSummary row={row} rules={rules} />
        </td>
        <td className="move-figure" data-field="startup">
          {root.startup ?? <span className="text-ink-400">—</span>}
        </td>
        <td className="move-figure" data-field="bestDamage">
          {row.bestDamage}
        </td>
      </tr>
      {/* Steps are rendered only when open: a cached page then carries the strings, not every step. */}
      {open &&
        row.steps.map((step, n) => (
          <Fragment key={`${step.kind} ${step.kind === "hit" ? step.move.id : step.cancel.id}`}>
            {step.kind === "hit" ? (
              <HitRow step={step} rules={rules} id={`${id}-${n}`} editBase={editBase} range={range} />
            ) : (
              <CancelRow step={step} rules={rules} id={`${id}-${n}`} />
            )}
          </Fragment>
        ))}
    </tbody>
  );
}

const indent = (depth: number) => ({ paddingLeft: `${0.75 + depth * 0.6}rem` });

/** A hit's range as the game measures it ("reaches 1.2 m"), explained on hover; nothing when the data has none. */
function Reach({ move, range }: { move: MoveEntry; range: RangeScale }) {
  const text = formatRange(move.range, range);
  if (text === null) return null;
  return (
    <span className="block text-[11px] text-ink-400" data-field="range" title={explainRange(move.range, range)}>
      {range.kind === "number" ? `reaches ${text}` : text}
    </span>
  );
}

/** The three outcomes of a step, labelled, so a screen reader and a phone read them without the header. */
function Outcomes({
  onBlock,
  hit,
  counterHit,
  tag,
}: {
  onBlock: ReactNode;
  hit: ReactNode;
  counterHit: ReactNode;
  tag: ReactNode;
}) {
  return (
    <span className="flex flex-col gap-0.5">
      <span className="flex flex-wrap items-baseline">
        <span data-field="onBlock">{onBlock}</span>
        {tag}
      </span>
      <span className="flex flex-wrap gap-x-1.5 text-xs text-ink-400">
        <span className="whitespace-nowrap">
          hit <span data-field="onHit">{hit}</span>
        </span>
        <span className="whitespace-nowrap">
          counter hit <span data-field="onCounterHit">{counterHit}</span>
        </span>
      </span>
    </span>
  );
}

function HitRow({
  step,
  rules,
  id,
  editBase,
  range,
}: {
  step: HitStep;
  rules: BlockRules;
  id: string;
  editBase: string | null;
  range: RangeScale;
}) {
  const { move } = step;
  // A number as the list shows it; for a coach on a draft, a button that fixes it in place.
  const fixable = (field: QuickField, shown: ReactNode) =>
    editBase ? (
      <QuickFix
        url={`${editBase}/${encodeURIComponent(move.key)}`}
        moveKey={move.key}
        version={move.version}
        field={field}
        value={move[field]}
      >
        {shown}
      </QuickFix>
    ) : (
      shown
    );
  const via = move.via;
  const notes = [...move.tags, move.notes].filter(Boolean).join(" · ");
  const startup = move.startup ?? <span className="text-ink-400">—</span>;
  return (
    <tr data-move-key={move.key} id={id} className="border-t border-ink-850 bg-ink-900/40">
      <th scope="row" className={`${td} text-left font-normal`} style={indent(step.depth)}>
        <span className="font-mono text-ink-100" title={move.input}>
          {step.input}
        </span>
        <span className="block text-xs text-ink-400">{move.name}</span>
        {step.guessPoint && (
          <span
            className="mt-0.5 inline-block rounded border border-accent-muted px-1 text-[10px] text-accent"
            title="Its follow-ups take different guards: the defender has to guess here"
          >
            guess point
          </span>
        )}
        <Reach move={move} range={range} />
        {notes && <span className="block text-[11px] text-ink-400">{notes}</span>}
        <span className="block text-xs text-ink-400 sm:hidden">
          startup <span data-field="startup">{fixable("startup", startup)}</span> · damage{" "}
          <span data-field="damage">{fixable("damage", move.damage)}</span>
        </span>
      </th>
      <td className={td}>
        <span className="flex flex-wrap items-center gap-1">
          <LevelBadge level={move.level} />
          {via?.kind === "follow" && (
            <span
              className="text-[11px] text-ink-400"
              data-field="gapOnBlock"
              title={`Gap on block before this hit: ${explainGap(via.gapOnBlock)}.`}
            >
              {gapJails(via.gapOnBlock) ? "jail" : `gap ${via.gapOnBlock}`}
              {via.comboOnHit ? " · combo" : via.comboOnCounterHit ? " · combo on counter hit" : ""}
            </span>
          )}
        </span>
      </td>
      <td className={td}>
        <Outcomes
          onBlock={fixable("onBlock", <Frames value={move.onBlock} title={explainOnBlock(move.onBlock, rules)} />)}
          hit={fixable("onHit", <Frames value={move.onHit} title={explainOnHit(move.onHit)} />)}
          counterHit={fixable(
            "onCounterHit",
            <Frames value={move.onCounterHit} title={explainOnHit(move.onCounterHit, { counterHit: true })} />,
          )}
          tag={<BlockClassTag onBlock={move.onBlock} rules={rules} />}
        />
      </td>
      <td className="move-figure">
        <span data-field="startup">{fixable("startup", startup)}</span>
      </td>
      <td className="move-figure">
        <span data-field="damage">{fixable("damage", move.damage)}</span>
        {step.depth > 0 && <span className="block text-[11px] text-ink-400">{step.damage} in all</span>}
      </td>
    </tr>
  );
}

function CancelRow({ step, rules, id }: { step: CancelStep; rules: BlockRules; id: string }) {
  const { cancel, from } = step;
  return (
    <tr data-cancel-key={cancel.key} id={id} className="border-t border-ink-850 bg-ink-900/40 text-ink-300">
      <th scope="row" className={`${td} text-left font-normal`} style={indent(step.depth)}>
        <span className="font-mono text-accent" title={`${from.input}${cancel.input}`}>
          {step.input}
        </span>
        <span className="block text-xs text-ink-400">cancel into {cancel.stance.name}</span>
      </th>
      <td className={`${td} text-xs`}>
        {cancel.autoGuard.length > 0 ? `auto-guard: ${cancel.autoGuard.join(", ")}` : ""}
      </td>
      <td className={td}>
        <Outcomes
          onBlock={<Frames value={cancel.onBlock} title={explainOnBlock(cancel.onBlock, rules)} />}
          hit={<Frames value={cancel.onHit} title={explainOnHit(cancel.onHit)} />}
          counterHit={
            <Frames value={cancel.onCounterHit} title={explainOnHit(cancel.onCounterHit, { counterHit: true })} />
          }
          tag={
            <>
              <BlockClassTag onBlock={cancel.onBlock} rules={rules} />
              {step.framesSaved !== null && (
                <span
                  className="ml-2 font-mono text-[11px] text-ink-400"
                  data-field="framesSaved"
                  title={explainFramesSaved(cancel.onBlock, from.onBlock)}
                >
                  {framesSavedLabel(step.framesSaved)}
                </span>
              )}
            </>
          }
        />
      </td>
      <td className={`${td} ${wide}`} />
      <td className={`${td} ${wide}`} />
    </tr>
  );
}
