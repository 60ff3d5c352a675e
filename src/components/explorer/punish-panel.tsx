"use client";

import { memo, useMemo, useState, type ReactNode } from "react";
import useSWR from "swr";
import { useExplorerStore } from "@/components/providers/explorer-store-provider";
import { Explained } from "@/components/ui/explained";
import {
  FOLLOW_UP_WORD,
  explainFollowUp,
  explainPunisher,
  formatOutcome,
  punishWindow,
  type PathResult,
} from "@/lib/engine";
import type { AppError } from "@/lib/errors";
import { graphUrl, type GraphResponse } from "@/lib/explorer";
import { fetcher } from "@/lib/fetcher";
import { followUpsAt, punishesFor, withBestCombos, type FollowUpOption, type Option } from "@/lib/punish";

function OptionRow({ o, children }: { o: Option; children: React.ReactNode }) {
  return (
    <li className="flex items-baseline justify-between gap-2 py-0.5 text-sm" data-option={o.id}>
      <span className="min-w-0 truncate">
        <span className="font-mono text-ink-100">{o.comboInput}</span>{" "}
        <span className="text-xs text-ink-400">{o.name}</span>
      </span>
      <span className="shrink-0 text-xs text-ink-300">{children}</span>
    </li>
  );
}

/** Lists past this many rows start folded: the best come first, and the rest are one click away. */
const SHORT_LIST = 8;

/**
 * The first {@link SHORT_LIST} rows of a ranked list, and a button for the rest.
 * Rows are keyed by place: a new path's list reuses the rows, so a click changes
 * their text rather than rebuilding them.
 */
function ShortList<T>({
  items,
  render,
  testId,
}: {
  items: readonly T[];
  render: (item: T, index: number) => ReactNode;
  testId?: string;
}) {
  const [open, setOpen] = useState(false);
  const shown = open ? items : items.slice(0, SHORT_LIST);
  return (
    <>
      <ul className="mt-1" data-testid={testId}>
        {shown.map(render)}
      </ul>
      {items.length > SHORT_LIST && (
        <button
          type="button"
          aria-expanded={open}
          onClick={() => setOpen((o) => !o)}
          className="mt-1 text-xs text-accent underline underline-offset-2"
        >
          {open ? `Show the best ${SHORT_LIST}` : `Show all ${items.length}`}
        </button>
      )}
    </>
  );
}

function FollowUps({
  label,
  advantage,
  list,
  fastest,
}: {
  label: string;
  advantage: PathResult["onHit"];
  list: FollowUpOption[];
  fastest: number;
}) {
  return (
    <div data-follow-ups={label}>
      <h4 className="text-xs text-ink-400">
        After {label} at <span className="font-mono">{formatOutcome(advantage)}</span>
      </h4>
      {typeof advantage !== "number" ? (
        <p className="text-sm text-ink-300">A {advantage.state}: what follows depends on the state, not on frames.</p>
      ) : list.length === 0 ? (
        <p className="text-sm text-ink-300">Nothing is guaranteed or a frame trap from here.</p>
      ) : (
        <ShortList
          items={list}
          render={(o, i) => (
            <OptionRow key={i} o={o}>
              <Explained explain={explainFollowUp(advantage, o.startup, { fastest })}>
                <span className={o.kind === "guaranteed" ? "text-block-plus" : "text-block-safe"}>
                  {FOLLOW_UP_WORD[o.kind]}
                </span>{" "}
                · {o.startup}f · {o.damage}
              </Explained>
            </OptionRow>
          )}
        />
      )}
    </div>
  );
}

/** What the ending costs if blocked (the opponent's punishers) and what the attacker keeps on hit. */
function PunishPanelView({ path, data, fastest }: { path: PathResult; data: GraphResponse; fastest: number }) {
  const opponentId = useExplorerStore((s) => s.opponent) ?? data.character.id;
  const setOpponent = useExplorerStore((s) => s.setOpponent);
  const same = opponentId === data.character.id;
  const {
    data: other,
    error,
    isLoading,
  } = useSWR<GraphResponse, AppError>(same ? null : graphUrl(opponentId, data.edition.slug), fetcher);
  const opponent = same ? data : other;

  const own = useMemo(() => withBestCombos(data.graph, data.starters), [data]);
  const theirs = useMemo(
    () => (opponent ? (same ? own : withBestCombos(opponent.graph, opponent.starters)) : null),
    [opponent, same, own],
  );

  const punishers = theirs ? punishesFor(path, theirs) : [];
  const numeric = typeof path.onBlock === "number";
  const punishUpTo = punishWindow(path.onBlock);
  const at = formatOutcome(path.onBlock);

  return (
    <section
      aria-labelledby="punish-title"
      className="space-y-3 rounded-lg border border-ink-800 bg-ink-900 p-4"
      data-testid="punish-panel"
    >
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h3 id="punish-title" className="text-xs tracking-wider text-ink-400 uppercase">
          If blocked
        </h3>
        <label className="flex items-center gap-2 text-sm">
          <span className="text-ink-400">Opponent</span>
          <select
            value={opponentId}
            onChange={(e) => setOpponent(Number(e.target.value) === data.character.id ? null : Number(e.target.value))}
            className="rounded border border-ink-700 bg-ink-900 px-1.5 py-0.5 text-ink-100"
          >
            {data.cast.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </select>
        </label>
      </div>
      {error ? (
        <p role="alert" className="text-sm text-block-launch-punishable">
          The opponent&apos;s moves could not be loaded: {error.message}
        </p>
      ) : isLoading || !theirs ? (
        <p role="status" className="text-sm text-ink-400">
          Loading the opponent&apos;s moves…
        </p>
      ) : !numeric ? (
        <p className="text-sm text-ink-300" data-testid="punish-verdict">
          Ends in a {formatOutcome(path.onBlock)}: no frame-based punish applies.
        </p>
      ) : punishers.length === 0 ? (
        <p className="text-sm text-ink-300" data-testid="punish-verdict">
          {punishUpTo === null
            ? `Safe: at ${at} you act first or at once.`
            : `Safe: at ${at} none of ${opponent?.character.name}'s moves is fast enough (${punishUpTo} frames or less, ${path.defenderStance}).`}
        </p>
      ) : (
        <div>
          <p className="text-sm text-ink-300" data-testid="punish-verdict">
            At {at}, {opponent?.character.name} ({path.defenderStance}) punishes with:
          </p>
          <ShortList
            testId="punishers"
            items={punishers}
            render={(o, i) => (
              <OptionRow key={i} o={o}>
                <Explained
                  explain={`${explainPunisher(o.startup, path.onBlock)} Can be done ${o.from === "any" ? "standing or crouching" : o.from}; ${o.damage} damage as ${o.comboInput}.`}
                >
                  {o.startup}f · {o.damage} dmg · {o.from}
                </Explained>
              </OptionRow>
            )}
          />
        </div>
      )}
      <div className="space-y-2 border-t border-ink-800 pt-2">
        <h3 className="text-xs tracking-wider text-ink-400 uppercase">If it lands</h3>
        <FollowUps
          label="a hit"
          advantage={path.onHit}
          list={followUpsAt(path, path.onHit, own, fastest)}
          fastest={fastest}
        />
        <FollowUps
          label="a counter hit"
          advantage={path.onCounterHit}
          list={followUpsAt(path, path.onCounterHit, own, fastest)}
          fastest={fastest}
        />
      </div>
    </section>
  );
}

/** Memoised: it re-renders when its path, data or fastest attack change, not with every render of the Explorer. */
export const PunishPanel = memo(PunishPanelView);
