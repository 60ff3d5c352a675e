"use client";

import Link from "next/link";
import { useCallback, useEffect, useMemo } from "react";
import useSWR from "swr";
import { GraphCanvas } from "@/components/graph/graph-canvas";
import { useExplorerStore } from "@/components/providers/explorer-store-provider";
import type { AppError } from "@/lib/errors";
import { DEFAULT_LAUNCH_AT, effectiveLaunchAt, type PathResult } from "@/lib/engine";
import { computePaths, graphUrl, pathKey, reachableSubgraph, type GraphResponse } from "@/lib/explorer";
import { fetcher } from "@/lib/fetcher";
import { explorerHref, explorerStateToView } from "@/lib/permalink";
import { useAfterPaint } from "@/lib/after-paint";
import { finishTimingAfterPaint, startTiming } from "@/lib/timing";
import dynamic from "next/dynamic";
import type { BoardTeam } from "@/components/boards/make-board";
import { FrameTimeline } from "./frame-timeline";
import { Legend } from "./legend";
import { OptionsBar } from "./options-bar";
import { PathCard } from "./path-card";
import { StanceSheetLink } from "./stance-sheet-link";
import { PathsTable } from "./paths-table";
import { PunishPanel } from "./punish-panel";
import { ShareButton, type ShareTeam } from "./share-dialog";

export interface ExplorerViewProps {
  characterId: number;
  root: string;
  /**
   * A permalink's read-only view: the Edition is fixed, the address is left
   * alone, and a link opens the same view in the live Explorer.
   */
  pinned?: boolean;
  /** The teams the signed-in user may share with; without it there is no Share button. */
  share?: { teams: ShareTeam[] };
  /** Given to a coach or owner of the game's team: on a draft Edition, its edit controls show. */
  editor?: { game: string; character: string };
  /** The teams where the signed-in user may make Mix-up boards (coach or owner). */
  boards?: { teams: BoardTeam[] };
}

const NO_PATHS: PathResult[] = [];

// Only coaches see these: their code (forms, the board's fill) loads for them alone, not with every Explorer.
const ExplorerMakeBoard = dynamic(() => import("@/components/boards/make-board").then((m) => m.ExplorerMakeBoard));
const DraftEditor = dynamic(() => import("./draft-editor").then((m) => m.DraftEditor));

export function ExplorerView({ characterId, root, pinned = false, share, editor, boards }: ExplorerViewProps) {
  const edition = useExplorerStore((s) => s.edition);
  const { data, error, isLoading, mutate } = useSWR<GraphResponse, AppError>(graphUrl(characterId, edition), fetcher, {
    keepPreviousData: true,
  });
  const selectedKey = useExplorerStore((s) => s.selected);
  const options = useExplorerStore((s) => s.options);
  const select = useExplorerStore((s) => s.select);
  const opponent = useExplorerStore((s) => s.opponent);

  const launchAt = effectiveLaunchAt(data?.game.launchAt ?? DEFAULT_LAUNCH_AT, options.fastest);
  // One object per rule change: graph nodes and table columns are memoised on it.
  const rules = useMemo(() => ({ fastest: options.fastest, launchAt }), [options.fastest, launchAt]);
  const sub = useMemo(() => (data ? reachableSubgraph(data.graph, root) : null), [data, root]);
  const computed = useMemo(() => {
    if (!sub || !data) return null;
    return computePaths(sub, root, { ...options, launchAt });
  }, [sub, data, root, options, launchAt]);

  const selected = useMemo(
    () => (selectedKey === null ? null : (computed?.byKey.get(selectedKey) ?? null)),
    [computed, selectedKey],
  );
  // The frame timeline and the table sit below the graph and follow one painted frame after the
  // card: a click paints the card and the graph's path first, without waiting for them.
  const laterKey = useAfterPaint(selectedKey);
  const laterPath = laterKey === null ? null : (computed?.byKey.get(laterKey) ?? null);
  const alternatives = useMemo(
    () => (selected ? (computed?.byEnd.get(selected.nodes[selected.nodes.length - 1]!) ?? NO_PATHS) : NO_PATHS),
    [computed, selected],
  );
  const pickAlternative = useCallback((p: PathResult) => select(pathKey(p)), [select]);

  const shareButton = useMemo(
    () => (share ? <ShareButton teams={share.teams} characterId={characterId} root={root} /> : null),
    [share, characterId, root],
  );

  useEffect(() => finishTimingAfterPaint("select"), [selected]);
  useEffect(() => finishTimingAfterPaint("recompute"), [computed]);

  // The view lives in the address too, so a reload or a copied link opens the same thing.
  // Written after the paint, once per burst of changes: the router re-renders on every
  // replaceState.
  useEffect(() => {
    if (pinned) return;
    const timer = window.setTimeout(() => {
      const params = new URLSearchParams(window.location.search);
      const set = (k: string, v: string | null) => (v === null ? params.delete(k) : params.set(k, v));
      set("edition", edition);
      set("path", selectedKey);
      set("depth", options.maxDepth === 8 ? null : String(options.maxDepth));
      set("visits", options.maxStanceVisits === 1 ? null : String(options.maxStanceVisits));
      set("fastest", data && options.fastest === data.game.fastest ? null : String(options.fastest));
      set("vs", opponent === null ? null : String(opponent));
      const next = `${window.location.pathname}?${params.toString()}`;
      if (next !== `${window.location.pathname}${window.location.search}`) window.history.replaceState(null, "", next);
    }, 200);
    return () => window.clearTimeout(timer);
  }, [pinned, edition, selectedKey, options, data, opponent]);

  if (error && !data) {
    return (
      <div role="alert" className="rounded-lg border border-block-launch-punishable/50 p-4 text-sm">
        <p className="text-ink-100">The graph could not be loaded: {error.message}</p>
        <button type="button" onClick={() => void mutate()} className="mt-2 rounded bg-accent px-3 py-1 text-ink-950">
          Try again
        </button>
      </div>
    );
  }
  if (isLoading || !data || !sub || !computed) {
    return (
      <div role="status" className="h-[60vh] animate-pulse rounded-lg bg-ink-900">
        <span className="sr-only">Loading the graph…</span>
      </div>
    );
  }
  if (!sub.nodes.some((n) => n.id === root)) {
    return (
      <p role="alert" className="rounded-lg border border-dashed border-ink-700 p-6 text-ink-300">
        {data.edition.name} has no move “{root}” for {data.character.name}.{" "}
        <Link
          href={`/games/${data.game.slug}/${data.character.slug}?edition=${data.edition.slug}`}
          className="text-accent underline"
        >
          Back to the move list
        </Link>
      </p>
    );
  }

  const onSelectNode = (id: string) => {
    startTiming("select");
    const first = computed.byEnd.get(id)?.[0];
    select(first ? pathKey(first) : null);
  };

  return (
    <div className="space-y-3">
      <OptionsBar
        editions={data.editions}
        edition={edition}
        pathCount={computed.paths.length}
        truncated={computed.truncated}
        pinnedTo={
          pinned
            ? {
                editionName: data.edition.name,
                liveHref: explorerHref({
                  gameSlug: data.game.slug,
                  characterSlug: data.character.slug,
                  edition,
                  view: explorerStateToView({ selected: selectedKey, options, opponent }, root),
                  gameFastest: data.game.fastest,
                }),
              }
            : undefined
        }
        actions={shareButton}
      />
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="min-w-0 space-y-3">
          <div
            className="overflow-hidden rounded-lg border border-ink-800 bg-ink-950 [contain:content]"
            data-testid="graph"
          >
            <GraphCanvas
              graph={sub}
              rules={rules}
              selected={selected}
              onSelectNode={onSelectNode}
              onClear={() => select(null)}
              exportName={`framefork-${data.character.slug}-${root}-${data.edition.slug}.png`.replace(
                /[^\w.+-]+/g,
                "_",
              )}
            />
          </div>
          {laterPath ? <FrameTimeline path={laterPath} graph={sub} rules={rules} /> : null}
        </div>
        {/* Beside the graph on a wide screen, as tall as it and scrolling on its own: a new
            selection then lays out this column alone, not the page. Above the graph on a phone,
            where the Path card leads and the graph is a view to pan. */}
        <div
          className="order-first space-y-4 lg:order-none lg:h-[68vh] lg:overflow-y-auto lg:p-1 lg:[contain:strict]"
          data-testid="path-column"
        >
          {editor && !pinned && data.edition.status === "draft" && (
            <DraftEditor
              draft={{ ...editor, edition: data.edition.slug }}
              graph={data.graph}
              path={selected}
              root={root}
              onChanged={async (edges) => {
                await mutate();
                if (edges) select(edges.length === 0 ? null : edges.join("|"));
              }}
            />
          )}
          {selected ? (
            <>
              <PathCard
                path={selected}
                graph={sub}
                rules={rules}
                range={data.game.range}
                alternatives={alternatives}
                onPickAlternative={pickAlternative}
              />
              <StanceSheetLink path={selected} graph={sub} data={data} />
              <PunishPanel path={selected} data={data} fastest={options.fastest} />
              {boards && boards.teams.length > 0 && !pinned && (
                <ExplorerMakeBoard teams={boards.teams} data={data} path={selected} root={root} rules={rules} />
              )}
            </>
          ) : (
            <div
              className="rounded-lg border border-dashed border-ink-700 p-4 text-sm text-ink-300"
              data-testid="path-card-empty"
            >
              {selectedKey !== null
                ? "The selected path is not reachable with these options. Pick a node to choose another."
                : "Pick a node in the graph: the path to it is selected and its outcome shows here."}
            </div>
          )}
        </div>
      </div>
      <PathsTable paths={computed.paths} graph={sub} selectedKey={laterKey} onSelect={select} rules={rules} />
      <Legend rules={rules} />
    </div>
  );
}
