"use client";

import { useRouter } from "next/navigation";
import { useId, useRef, useState } from "react";
import useSWR from "swr";
import { useExplorerStore } from "@/components/providers/explorer-store-provider";
import type { BoardDocument } from "@/lib/board";
import type { BoardDto } from "@/lib/dto";
import { DEFAULT_VALUE_TABLE, fillSituation, type MoveGraph, type PathResult } from "@/lib/engine";
import { AppError } from "@/lib/errors";
import { graphUrl, pathKey, type GraphResponse } from "@/lib/explorer";
import { fetcher, sendJson } from "@/lib/fetcher";
import { withBestCombos } from "@/lib/punish";

export interface BoardTeam {
  slug: string;
  name: string;
}

const button =
  "rounded border border-ink-700 bg-ink-900 px-3 py-1 text-sm text-ink-100 hover:border-accent focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-accent disabled:opacity-50";
const primary =
  "rounded bg-accent px-3 py-1 text-sm font-medium text-ink-950 hover:bg-accent-strong focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-accent disabled:opacity-50";

/** The board's first situation, filled by the engine from the end of the path, valued by the default table. */
export function boardFromPath(
  graph: MoveGraph,
  path: PathResult,
  opponent: GraphResponse,
  rules: { fastest: number; launchAt: number },
): BoardDocument {
  const moves = withBestCombos(opponent.graph, opponent.starters)
    .filter((o) => o.stance === null)
    .map((o) => ({ id: o.id, input: o.comboInput, startup: o.startup, damage: o.damage, from: o.from }));
  const filled = fillSituation(graph, path, { opponent: moves, ...rules });
  return {
    root: "s1",
    values: DEFAULT_VALUE_TABLE,
    situations: [
      {
        id: "s1",
        name: filled.name.slice(0, 80),
        note: "",
        rows: filled.rows.map((r) => r.slice(0, 40)),
        cols: filled.cols.map((c) => c.slice(0, 40)),
        cells: filled.cells.map((r) => r.map((basis) => ({ basis, override: null, next: null }))),
      },
    ],
  };
}

/** A board to fill by hand: one two-by-two situation of zeros. */
export function emptyBoard(name: string): BoardDocument {
  const zero = () => ({ basis: null, override: 0, next: null });
  return {
    root: "s1",
    values: DEFAULT_VALUE_TABLE,
    situations: [
      {
        id: "s1",
        name: name.slice(0, 80),
        note: "",
        rows: ["Option 1", "Option 2"],
        cols: ["Answer 1", "Answer 2"],
        cells: [
          [zero(), zero()],
          [zero(), zero()],
        ],
      },
    ],
  };
}

/** The Explorer's "Make a board", against the opponent chosen in the punish panel (shared through SWR). */
export function ExplorerMakeBoard({
  teams,
  data,
  path,
  root,
  rules,
}: {
  teams: BoardTeam[];
  data: GraphResponse;
  path: PathResult;
  root: string;
  rules: { fastest: number; launchAt: number };
}) {
  const opponentId = useExplorerStore((s) => s.opponent) ?? data.character.id;
  const same = opponentId === data.character.id;
  const { data: other } = useSWR<GraphResponse, AppError>(
    same ? null : graphUrl(opponentId, data.edition.slug),
    fetcher,
  );
  return (
    <MakeBoardButton
      teams={teams}
      data={data}
      opponent={same ? data : (other ?? null)}
      path={path}
      pathKey={pathKey(path)}
      root={root}
      rules={rules}
    />
  );
}

/**
 * "Make a board" beside the Path card: a Mix-up board whose first situation is the end of
 * the selected path, filled by the engine (or empty, to build by hand), saved to one of the
 * coach's teams and opened.
 */
export function MakeBoardButton({
  teams,
  data,
  opponent,
  path,
  pathKey,
  root,
  rules,
}: {
  teams: BoardTeam[];
  data: GraphResponse;
  /** The opponent's data (the character itself when no other is chosen); null while it loads. */
  opponent: GraphResponse | null;
  path: PathResult;
  pathKey: string;
  root: string;
  rules: { fastest: number; launchAt: number };
}) {
  const router = useRouter();
  const dialog = useRef<HTMLDialogElement>(null);
  const ids = useId();
  const [team, setTeam] = useState(teams[0]?.slug ?? "");
  const [title, setTitle] = useState("");
  const [byHand, setByHand] = useState(false);
  const [status, setStatus] = useState<{ kind: "idle" | "sending" } | { kind: "error"; message: string }>({
    kind: "idle",
  });

  const make = async () => {
    if (!opponent) return;
    const name = title.trim() || `After ${path.input}`;
    setStatus({ kind: "sending" });
    try {
      const document = byHand ? emptyBoard(`After ${path.input}`) : boardFromPath(data.graph, path, opponent, rules);
      const made = await sendJson<{ board: BoardDto }>("POST", `/api/teams/${team}/boards`, {
        characterId: data.character.id,
        edition: data.edition.slug,
        opponentId: opponent.character.id === data.character.id ? null : opponent.character.id,
        title: name.slice(0, 120),
        origin: { root, path: pathKey },
        document,
      });
      if (!made) throw new AppError("internal", "The server made the board but did not say where it is.");
      router.push(`/teams/${team}/boards/${made.board.id}`);
    } catch (error) {
      setStatus({
        kind: "error",
        message: error instanceof AppError ? error.message : "The board could not be made. Try again.",
      });
    }
  };

  return (
    <>
      <button
        type="button"
        className={button}
        aria-haspopup="dialog"
        onClick={() => {
          setStatus({ kind: "idle" });
          dialog.current?.showModal();
        }}
      >
        Make a board
      </button>
      <dialog
        ref={dialog}
        aria-labelledby={`${ids}-title`}
        className="m-auto max-h-[calc(100dvh-2rem)] w-[min(32rem,calc(100vw-2rem))] overflow-y-auto rounded-lg border border-ink-700 bg-ink-850 p-5 text-sm text-ink-100 backdrop:bg-ink-950/70"
      >
        <h2 id={`${ids}-title`} className="mb-3 text-base font-semibold">
          A Mix-up board after <span className="font-mono">{path.input}</span>
        </h2>
        <div className="space-y-3">
          <p className="text-ink-300">
            The first situation is the defender having blocked {path.input}: each way on for the attacker against each
            guard (and a fast attack in a gap), every cell filled from the frame data
            {opponent && opponent.character.id !== data.character.id ? ` against ${opponent.character.name}` : ""}. You
            can change any cell and add situations after it.
          </p>
          <label className="block space-y-1">
            <span className="text-ink-400">Team</span>
            <select
              value={team}
              onChange={(e) => setTeam(e.target.value)}
              className="w-full rounded border border-ink-700 bg-ink-900 px-2 py-1 text-ink-100"
            >
              {teams.map((t) => (
                <option key={t.slug} value={t.slug}>
                  {t.name}
                </option>
              ))}
            </select>
          </label>
          <label className="block space-y-1">
            <span className="text-ink-400">Title</span>
            <input
              value={title}
              maxLength={120}
              placeholder={`After ${path.input}`}
              onChange={(e) => setTitle(e.target.value)}
              className="w-full rounded border border-ink-700 bg-ink-900 px-2 py-1 text-ink-100"
            />
          </label>
          <label className="flex items-center gap-2">
            <input
              type="checkbox"
              checked={byHand}
              onChange={(e) => setByHand(e.target.checked)}
              className="accent-accent"
            />
            <span>Start empty and fill it by hand</span>
          </label>
          {status.kind === "error" && (
            <p role="alert" className="rounded border border-block-launch-punishable/50 p-2">
              {status.message}
            </p>
          )}
          <div className="flex justify-end gap-2">
            <button type="button" className={button} onClick={() => dialog.current?.close()}>
              Cancel
            </button>
            <button
              type="button"
              className={primary}
              disabled={status.kind === "sending" || !opponent || team === ""}
              onClick={() => void make()}
            >
              {status.kind === "sending" ? "Making the board…" : !opponent ? "Loading the opponent…" : "Make the board"}
            </button>
          </div>
        </div>
      </dialog>
    </>
  );
}
