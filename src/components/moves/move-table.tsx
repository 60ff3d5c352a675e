import Link from "next/link";
import type { ReactNode } from "react";
import type { CancelEntry, MoveEntry, MoveList } from "@/lib/dto";
import { BlockClassTag, type BlockRules } from "@/components/ui/block-class";
import { Frames } from "@/components/ui/frames";
import { LevelBadge } from "@/components/ui/level-badge";
import type { QuickField } from "@/lib/edit-forms";
import { QuickFix } from "./quick-fix";
import { explainFramesSaved, explainGap, explainOnBlock, framesSaved, framesSavedLabel, gapJails } from "@/lib/engine";

interface Section {
  id: string;
  title: string;
  note: string | null;
  moves: MoveEntry[];
  /** A stance's section: the stance. */
  stance?: { key: string; name: string };
}

function sections(list: MoveList): Section[] {
  const neutral: Section = { id: "neutral", title: "Neutral", note: null, moves: [] };
  const byStance = new Map<number, Section>(
    list.stances.map((s) => [
      s.id,
      {
        id: `stance-${s.key}`,
        title: `From ${s.name} (${s.abbreviation})`,
        note: s.notes,
        moves: [],
        stance: s,
      },
    ]),
  );
  for (const m of list.moves) (m.stance ? byStance.get(m.stance.id) : neutral)?.moves.push(m);
  return [neutral, ...byStance.values()].filter((s) => s.moves.length > 0);
}

const th = "px-2 py-2 text-left font-medium text-ink-400 whitespace-nowrap";
const td = "px-2 py-1.5 align-top whitespace-nowrap";

function GapCell({ move }: { move: MoveEntry }) {
  const via = move.via;
  if (via?.kind !== "follow") return <span className="text-ink-600">—</span>;
  const jails = gapJails(via.gapOnBlock);
  return (
    <span className="font-mono tabular-nums" title={`Gap on block before this hit: ${explainGap(via.gapOnBlock)}.`}>
      {jails ? "jail" : via.gapOnBlock}
      {via.comboOnHit ? (
        <span className="ml-1 text-block-plus" title="Combos if the previous hit connected">
          combo
        </span>
      ) : null}
    </span>
  );
}

function CancelRow({ cancel, from, rules }: { cancel: CancelEntry; from: MoveEntry; rules: BlockRules }) {
  const saved = framesSaved(cancel.onBlock, from.onBlock);
  return (
    <tr data-cancel-key={cancel.key} className="border-t border-ink-850 bg-ink-900/40 text-ink-300">
      <td
        className={`${td} sticky left-0 bg-ink-900 font-mono`}
        style={{ paddingLeft: `${0.5 + (from.depth + 1) * 1}rem` }}
      >
        {from.input}
        <span className="text-accent">{cancel.input}</span>
      </td>
      <td className={td}>
        cancel into {cancel.stance.name}
        {saved !== null && (
          <span
            className="ml-2 font-mono text-xs text-ink-400"
            title={explainFramesSaved(cancel.onBlock, from.onBlock)}
          >
            {framesSavedLabel(saved)}
          </span>
        )}
      </td>
      <td className={td} />
      <td className={td} />
      <td className={td} />
      <td className={td} />
      <td className={td}>
        <Frames value={cancel.onBlock} title={explainOnBlock(cancel.onBlock, rules)} />
        <BlockClassTag onBlock={cancel.onBlock} rules={rules} />
      </td>
      <td className={td}>
        <Frames value={cancel.onHit} />
      </td>
      <td className={td}>
        <Frames value={cancel.onCounterHit} />
      </td>
      <td className={`${td} text-xs`}>
        {cancel.autoGuard.length > 0 ? `auto-guard: ${cancel.autoGuard.join(", ")}` : ""}
      </td>
    </tr>
  );
}

/** A character's move list in one edition: strings indented under their first hit, cancels under the hit they end. */
export function MoveTable({
  list,
  rules,
  exploreHref,
  moveUrl,
  stanceHref,
}: {
  list: MoveList;
  rules: BlockRules;
  /** Where the Explorer opens a string that starts with this move. */
  exploreHref: (moveKey: string) => string;
  /** For a coach on a draft: a move's address under the edit routes; its numbers are then fixed in place. */
  moveUrl?: (moveKey: string) => string;
  /** A stance's sheet (its ways in and what follows them). */
  stanceHref?: (stanceKey: string) => string;
}) {
  const cancelsFrom = new Map<number, CancelEntry[]>();
  for (const c of list.cancels) cancelsFrom.set(c.fromId, [...(cancelsFrom.get(c.fromId) ?? []), c]);

  return (
    <div className="space-y-8">
      {sections(list).map((section) => (
        <section key={section.id} aria-labelledby={section.id} className="space-y-2">
          <h2 id={section.id} className="text-sm font-semibold tracking-wider text-ink-400 uppercase">
            {section.title}
          </h2>
          {section.note && <p className="text-sm text-ink-300">{section.note}</p>}
          {section.stance && stanceHref && (
            <p className="text-sm">
              <Link href={stanceHref(section.stance.key)}>
                Every way into {section.stance.name} and what follows it →
              </Link>
            </p>
          )}
          <div className="overflow-x-auto rounded-lg border border-ink-800">
            <table className="min-w-full text-sm">
              <thead className="bg-ink-900">
                <tr>
                  <th scope="col" className={`${th} sticky left-0 bg-ink-900`}>
                    Input
                  </th>
                  <th scope="col" className={th}>
                    Name
                  </th>
                  <th scope="col" className={th}>
                    Level
                  </th>
                  <th scope="col" className={th}>
                    Damage
                  </th>
                  <th scope="col" className={th}>
                    Startup
                  </th>
                  <th scope="col" className={th} title="Frames the defender is free on block before this hit">
                    Gap
                  </th>
                  <th scope="col" className={th}>
                    On block
                  </th>
                  <th scope="col" className={th}>
                    On hit
                  </th>
                  <th scope="col" className={th}>
                    On counter hit
                  </th>
                  <th scope="col" className={th}>
                    Notes
                  </th>
                </tr>
              </thead>
              <tbody>
                {section.moves.map((m) => (
                  <MoveRows
                    key={m.id}
                    move={m}
                    cancels={cancelsFrom.get(m.id) ?? []}
                    rules={rules}
                    exploreHref={exploreHref}
                    moveUrl={moveUrl}
                  />
                ))}
              </tbody>
            </table>
          </div>
        </section>
      ))}
    </div>
  );
}

function MoveRows({
  move,
  cancels,
  rules,
  exploreHref,
  moveUrl,
}: {
  move: MoveEntry;
  cancels: CancelEntry[];
  rules: BlockRules;
  exploreHref: (moveKey: string) => string;
  moveUrl?: (moveKey: string) => string;
}) {
  // A number as the list shows it; for a coach on a draft, a button that fixes it in place.
  const fixable = (field: QuickField, shown: ReactNode) =>
    moveUrl ? (
      <QuickFix url={moveUrl(move.key)} moveKey={move.key} version={move.version} field={field} value={move[field]}>
        {shown}
      </QuickFix>
    ) : (
      shown
    );
  const notes = [move.range, ...move.tags].filter(Boolean).join(" · ");
  return (
    <>
      <tr data-move-key={move.key} className="border-t border-ink-800 hover:bg-ink-900">
        <th
          scope="row"
          className={`${td} sticky left-0 bg-ink-950 text-left font-mono font-normal text-ink-100`}
          style={{ paddingLeft: `${0.5 + move.depth * 1}rem` }}
        >
          {move.depth === 0 ? (
            <Link
              href={exploreHref(move.key)}
              className="text-ink-100 underline decoration-ink-600 hover:decoration-accent"
              title={`Open ${move.input} in the Explorer`}
            >
              {move.input}
            </Link>
          ) : (
            move.input
          )}
        </th>
        <td className={td}>{move.name}</td>
        <td className={td}>
          <LevelBadge level={move.level} />
        </td>
        <td className={`${td} font-mono tabular-nums`}>{fixable("damage", move.damage)}</td>
        <td className={`${td} font-mono tabular-nums`}>
          {fixable("startup", move.startup ?? <span className="text-ink-600">—</span>)}
        </td>
        <td className={td}>
          <GapCell move={move} />
        </td>
        <td className={td}>
          <span data-field="onBlock">
            {fixable("onBlock", <Frames value={move.onBlock} title={explainOnBlock(move.onBlock, rules)} />)}
          </span>
          <BlockClassTag onBlock={move.onBlock} rules={rules} />
        </td>
        <td className={td} data-field="onHit">
          {fixable("onHit", <Frames value={move.onHit} />)}
        </td>
        <td className={td} data-field="onCounterHit">
          {fixable("onCounterHit", <Frames value={move.onCounterHit} />)}
        </td>
        <td className={`${td} text-xs text-ink-400`}>{notes}</td>
      </tr>
      {cancels.map((c) => (
        <CancelRow key={c.id} cancel={c} from={move} rules={rules} />
      ))}
    </>
  );
}
