"use client";

import Link from "next/link";
import { useRef, useState, type ReactNode } from "react";
import { toPng } from "html-to-image";
import { downloadDataUrl } from "@/components/ui/download";
import { BlockClassTag } from "@/components/ui/block-class";
import { Explained } from "@/components/ui/explained";
import { Frames } from "@/components/ui/frames";
import { LevelBadge } from "@/components/ui/level-badge";
import { DistanceInput } from "@/components/ui/number-field";
import {
  explainAfterCancel,
  explainAutoGuard,
  explainComboAfterCancel,
  explainFramesSaved,
  explainOnBlock,
  explainOnHit,
  explainRange,
  FOLLOW_UP_WORD,
  formatRange,
  framesSavedLabel,
  gapJails,
  reachesAt,
  turnsPunishableSafe,
  type StanceGridCell,
  type StanceMove,
  type StanceWayIn,
} from "@/lib/engine";
import type { StanceSheetDto } from "@/lib/dto";
import { explorerHref, VIEW_BOUNDS } from "@/lib/permalink";
import { REACH_PARAM, SAFE_ONLY_PARAM } from "@/lib/stance-sheet";

const th = "px-2 py-2 text-left font-medium text-ink-400 whitespace-nowrap";
const td = "px-2 py-1.5 align-top whitespace-nowrap";

/**
 * A stance's sheet: every way in (the ending it replaces beside the one it gives), the moves
 * done from the stance, and the grid of each way in against each move. Every figure comes from
 * the engine's `stanceSheet` and explains itself on hover and on keyboard focus.
 */
export function StanceSheetView({
  data,
  safeOnly: initialSafeOnly,
  reach: initialReach = null,
  linkToExplorer,
  actions,
  ready = true,
}: {
  /** False while a cached page shows the sheet before the browser has read its address. */
  ready?: boolean;
  data: StanceSheetDto;
  safeOnly: boolean;
  /** In a game that measures range in numbers: only the stance's moves that reach this far. */
  reach?: number | null;
  /** Rows open their path in the live Explorer (not on a shared link, which may outlive access). */
  linkToExplorer: boolean;
  /** Buttons beside the export (Share). */
  actions?: ReactNode;
}) {
  const [safeOnly, setSafeOnly] = useState(initialSafeOnly);
  const [reach, setReach] = useState(initialReach);
  const sheetRef = useRef<HTMLDivElement>(null);
  const rules = { fastest: data.game.fastest, launchAt: data.game.launchAt };
  const { sheet } = data;
  const waysIn = safeOnly
    ? sheet.waysIn.filter((w) => turnsPunishableSafe(w.raw.onBlock, w.cancelled.onBlock, rules))
    : sheet.waysIn;

  const moves = reach === null ? sheet.moves : sheet.moves.filter((m) => reachesAt(data.ranges[m.move], reach));

  const keep = (param: string, value: string | null) => {
    const url = new URL(window.location.href);
    if (value !== null) url.searchParams.set(param, value);
    else url.searchParams.delete(param);
    window.history.replaceState(null, "", url);
  };
  const toggle = (on: boolean) => {
    setSafeOnly(on);
    keep(SAFE_ONLY_PARAM, on ? "1" : null);
  };
  const changeReach = (d: number | null) => {
    setReach(d);
    keep(REACH_PARAM, d === null ? null : String(d));
  };

  const exploreHref = (w: StanceWayIn) => {
    const at = data.paths[w.cancel];
    if (!linkToExplorer || !at) return null;
    return explorerHref({
      gameSlug: data.game.slug,
      characterSlug: data.character.slug,
      edition: data.edition.slug,
      view: {
        root: at.root,
        path: at.path,
        options: {
          maxDepth: VIEW_BOUNDS.maxDepth.default,
          maxStanceVisits: VIEW_BOUNDS.maxStanceVisits.default,
          fastest: data.game.fastest,
        },
        opponent: null,
      },
      gameFastest: data.game.fastest,
    });
  };

  const fileName = `framefork-${data.character.slug}-${data.stance.key}-${data.edition.slug}.png`;

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center gap-3">
        {/* Inert until the address is read (see `ready`): a choice made earlier would be lost. */}
        <fieldset disabled={!ready} className="contents">
          <label className="flex items-center gap-2 text-sm text-ink-200">
            <input
              type="checkbox"
              checked={safeOnly}
              onChange={(e) => toggle(e.target.checked)}
              className="accent-accent"
            />
            Only cancels that turn a punishable ending safe
          </label>
          {data.game.range.kind === "number" && (
            <DistanceInput
              label="Stance moves that reach at"
              unit={data.game.range.unit}
              value={reach}
              onChange={changeReach}
            />
          )}
        </fieldset>
        <div className="ml-auto flex items-center gap-2">
          {actions}
          <ExportSheetButton target={sheetRef} fileName={fileName} />
        </div>
      </div>
      <div ref={sheetRef} className="space-y-6 bg-ink-950 p-1">
        <WaysIn
          data={data}
          waysIn={waysIn}
          total={sheet.waysIn.length}
          safeOnly={safeOnly}
          rules={rules}
          exploreHref={exploreHref}
        />
        <Grid data={data} waysIn={waysIn} moves={moves} reach={reach} />
      </div>
      <FromTheStance data={data} rules={rules} moves={moves} reach={reach} />
    </div>
  );
}

function HeaderRow({ labels }: { labels: string[] }) {
  return (
    <thead className="bg-ink-900">
      <tr>
        {labels.map((label) => (
          <th key={label} scope="col" className={th}>
            {label}
          </th>
        ))}
      </tr>
    </thead>
  );
}

function WaysIn({
  data,
  waysIn,
  total,
  safeOnly,
  rules,
  exploreHref,
}: {
  data: StanceSheetDto;
  waysIn: StanceWayIn[];
  total: number;
  safeOnly: boolean;
  rules: { fastest: number; launchAt: number };
  exploreHref: (w: StanceWayIn) => string | null;
}) {
  return (
    <section aria-labelledby="ways-in" className="space-y-2">
      <h2 id="ways-in" className="text-sm font-semibold tracking-wider text-ink-400 uppercase">
        Ways in
      </h2>
      {total === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-700 p-4 text-ink-300">
          Nothing cancels into {data.stance.name} in {data.edition.name}.
        </p>
      ) : waysIn.length === 0 && safeOnly ? (
        <p role="status" className="rounded-lg border border-dashed border-ink-700 p-4 text-ink-300">
          No cancel into {data.stance.name} turns a punishable ending safe. Clear the filter to see all {total}.
        </p>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-ink-800">
          <table className="min-w-full text-sm">
            <caption className="sr-only">Cancels into {data.stance.name}, best ending on block first</caption>
            <HeaderRow
              labels={[
                "Input",
                "Stopping at the hit",
                "Cancelled",
                "Frames saved",
                "On hit",
                "On counter hit",
                "Auto-guard",
              ]}
            />
            <tbody>
              {waysIn.map((w) => {
                const href = exploreHref(w);
                return (
                  <tr key={w.cancel} data-way-in={w.cancel} className="border-t border-ink-850">
                    <th scope="row" className={`${td} text-left font-mono font-normal`}>
                      {href ? (
                        <Link href={href} aria-label={`${w.input} in the Explorer`} data-field="input">
                          {w.input}
                        </Link>
                      ) : (
                        <span data-field="input">{w.input}</span>
                      )}
                    </th>
                    <td className={td}>
                      <Explained explain={explainOnBlock(w.raw.onBlock, rules)} field="raw-onBlock">
                        <Frames value={w.raw.onBlock} />
                      </Explained>
                      <BlockClassTag onBlock={w.raw.onBlock} rules={rules} />
                    </td>
                    <td className={td}>
                      <Explained explain={explainOnBlock(w.cancelled.onBlock, rules)} field="onBlock">
                        <Frames value={w.cancelled.onBlock} />
                      </Explained>
                      <BlockClassTag onBlock={w.cancelled.onBlock} rules={rules} />
                    </td>
                    <td className={td}>
                      <Explained explain={explainFramesSaved(w.cancelled.onBlock, w.raw.onBlock)} field="framesSaved">
                        <span className="font-mono">
                          {w.framesSaved === null ? "—" : framesSavedLabel(w.framesSaved)}
                        </span>
                      </Explained>
                    </td>
                    <td className={td}>
                      <Explained explain={explainOnHit(w.cancelled.onHit)} field="onHit">
                        <Frames value={w.cancelled.onHit} />
                      </Explained>
                    </td>
                    <td className={td}>
                      <Explained
                        explain={explainOnHit(w.cancelled.onCounterHit, { counterHit: true })}
                        field="onCounterHit"
                      >
                        <Frames value={w.cancelled.onCounterHit} />
                      </Explained>
                    </td>
                    <td className={td}>
                      <Explained explain={explainAutoGuard(w.autoGuard)} field="autoGuard">
                        <span className="text-xs">{w.autoGuard.length > 0 ? w.autoGuard.join(", ") : "none"}</span>
                      </Explained>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}

/** Why a list of the stance's moves is empty: none at all, or none that reaches the distance asked for. */
function noMoves(data: StanceSheetDto, reach: number | null): string {
  return data.sheet.moves.length === 0 || reach === null
    ? `${data.stance.name} has no moves of its own in ${data.edition.name}.`
    : `No move from ${data.stance.name} reaches at ${formatRange(String(reach), data.game.range)}. Clear the distance to see all ${data.sheet.moves.length}.`;
}

function Grid({
  data,
  waysIn,
  moves,
  reach,
}: {
  data: StanceSheetDto;
  waysIn: StanceWayIn[];
  moves: StanceMove[];
  reach: number | null;
}) {
  const { grid } = data.sheet;
  const cells = new Map<string, StanceGridCell>(grid.map((c) => [`${c.cancel}\n${c.enter}`, c]));
  const byCancel = new Map(data.sheet.waysIn.map((w) => [w.cancel, w]));
  return (
    <section aria-labelledby="grid" className="space-y-2">
      <h2 id="grid" className="text-sm font-semibold tracking-wider text-ink-400 uppercase">
        The grid
      </h2>
      {waysIn.length === 0 || moves.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-700 p-4 text-ink-300">
          {moves.length === 0
            ? `${noMoves(data, reach)} There is nothing to follow a cancel with.`
            : "No way in to pair with the stance's moves."}
        </p>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-ink-800" data-testid="stance-grid">
          <table className="min-w-full text-sm">
            <caption className="sr-only">
              Each way in against each move from {data.stance.name}: gap on block, combo on hit and counter hit,
              follow-up class
            </caption>
            <thead className="bg-ink-900">
              <tr>
                <th scope="col" className={th}>
                  Way in
                </th>
                {moves.map((m) => (
                  <th key={m.enter} scope="col" className={`${th} font-mono`}>
                    {m.input}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {waysIn.map((w) => (
                <tr key={w.cancel} className="border-t border-ink-850">
                  <th scope="row" className={`${td} text-left font-mono font-normal`}>
                    {w.input}
                  </th>
                  {moves.map((m) => {
                    const cell = cells.get(`${w.cancel}\n${m.enter}`);
                    return (
                      <td key={m.enter} className={td} data-cancel={w.cancel} data-enter={m.enter}>
                        {cell ? <GridCell cell={cell} way={byCancel.get(w.cancel)!} move={m} data={data} /> : null}
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}

function GridCell({
  cell,
  way,
  move,
  data,
}: {
  cell: StanceGridCell;
  way: StanceWayIn;
  move: StanceMove;
  data: StanceSheetDto;
}) {
  const explained = explainAfterCancel(way.cancelled.onBlock, move.startup, { fastest: data.game.fastest });
  return (
    <span className="inline-flex flex-wrap items-center gap-1.5">
      {cell.gapOnBlock === null || !explained ? (
        <span className="text-ink-600" title="No gap: the cancel ends in a state or the move has no startup">
          —
        </span>
      ) : (
        <Explained explain={explained.gap} field="gapOnBlock">
          <span className="font-mono tabular-nums">{gapJails(cell.gapOnBlock) ? "jail" : cell.gapOnBlock}</span>
        </Explained>
      )}
      <Explained explain={explainComboAfterCancel(way.cancelled.onHit, move.startup)} field="comboOnHit">
        <span className={`text-xs ${cell.comboOnHit ? "text-block-plus" : "text-ink-500"}`}>
          {cell.comboOnHit ? "combo" : "no combo"}
        </span>
      </Explained>
      <Explained
        explain={explainComboAfterCancel(way.cancelled.onCounterHit, move.startup, { counterHit: true })}
        field="comboOnCounterHit"
      >
        <span className={`text-xs ${cell.comboOnCounterHit ? "text-block-plus" : "text-ink-500"}`}>
          {cell.comboOnCounterHit ? "CH combo" : "no CH combo"}
        </span>
      </Explained>
      {cell.followUp && explained ? (
        <Explained explain={explained.followUp} field="followUp">
          <span className="text-xs text-ink-200">{FOLLOW_UP_WORD[cell.followUp]}</span>
        </Explained>
      ) : null}
    </span>
  );
}

function FromTheStance({
  data,
  rules,
  moves,
  reach,
}: {
  data: StanceSheetDto;
  rules: { fastest: number; launchAt: number };
  moves: StanceMove[];
  reach: number | null;
}) {
  return (
    <section aria-labelledby="from-stance" className="space-y-2">
      <h2 id="from-stance" className="text-sm font-semibold tracking-wider text-ink-400 uppercase">
        From the stance
      </h2>
      {moves.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-700 p-4 text-ink-300">{noMoves(data, reach)}</p>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-ink-800">
          <table className="min-w-full text-sm">
            <HeaderRow labels={["Input", "Level", "Startup", "Damage", "On block", "Range"]} />
            <tbody>
              {moves.map((m) => (
                <tr key={m.enter} data-stance-move={m.move} className="border-t border-ink-850">
                  <th scope="row" className={`${td} text-left font-mono font-normal`}>
                    {m.input}
                  </th>
                  <td className={td}>
                    <LevelBadge level={m.level} />
                  </td>
                  <td className={`${td} font-mono`}>{m.startup ?? "—"}</td>
                  <td className={`${td} font-mono`}>{m.damage}</td>
                  <td className={td}>
                    <Explained explain={explainOnBlock(m.onBlock, rules)} field="onBlock">
                      <Frames value={m.onBlock} />
                    </Explained>
                    <BlockClassTag onBlock={m.onBlock} rules={rules} />
                  </td>
                  <td className={`${td} font-mono`}>
                    <Explained explain={explainRange(data.ranges[m.move], data.game.range)} field="range">
                      {formatRange(data.ranges[m.move], data.game.range) ?? "—"}
                    </Explained>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}

/** Saves the ways in and the grid as a PNG, each table at its full width (not cut by its scroll box). */
function ExportSheetButton({ target, fileName }: { target: React.RefObject<HTMLDivElement | null>; fileName: string }) {
  const [state, setState] = useState<"idle" | "working" | "failed">("idle");
  const exportPng = async () => {
    const node = target.current;
    if (!node) return;
    setState("working");
    const boxes = [...node.querySelectorAll<HTMLElement>(".overflow-x-auto")];
    const width = Math.max(node.scrollWidth, ...boxes.map((b) => b.scrollWidth));
    try {
      const dataUrl = await toPng(node, {
        backgroundColor: "#0b0d12",
        width,
        style: { width: `${width}px` },
        filter: (n) => !(n instanceof HTMLElement && n.getAttribute("role") === "tooltip"),
      });
      downloadDataUrl(dataUrl, fileName);
      setState("idle");
    } catch {
      setState("failed");
    }
  };
  return (
    <button
      type="button"
      onClick={() => void exportPng()}
      disabled={state === "working"}
      className="rounded border border-ink-700 bg-ink-900 px-3 py-1 text-sm text-ink-100 hover:border-accent disabled:opacity-60"
    >
      {state === "working" ? "Saving…" : state === "failed" ? "Saving failed: try again" : "Save as PNG"}
    </button>
  );
}
