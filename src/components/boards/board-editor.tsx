"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useEffect, useMemo } from "react";
import { BoardStoreProvider, useBoardStore } from "@/components/providers/board-store-provider";
import { boardDocumentSchema, boardToSolve, type BoardDocument } from "@/lib/board";
import type { BoardDto, SharedBoardDto } from "@/lib/dto";
import { BoardInputError, formatPayoff, solveBoard, type BoardSolution } from "@/lib/engine";
import { AppError, VersionConflict } from "@/lib/errors";
import { sendJson } from "@/lib/fetcher";
import { finishTimingAfterPaint } from "@/lib/timing";
import { BoardShareButton } from "./board-share";
import { BoardTree } from "./board-tree";
import { SituationPanel } from "./situation-panel";
import { ValueTableForm } from "./value-table";

type Solved = { ok: true; solution: BoardSolution } | { ok: false; message: string };

/** Solves on every change: the solver is fast enough for a keystroke (npm run bench: board_100x6x6_ms). */
function useSolved(document: BoardDocument): Solved {
  return useMemo(() => {
    try {
      return { ok: true, solution: solveBoard(boardToSolve(document)) };
    } catch (error) {
      if (error instanceof BoardInputError) return { ok: false, message: error.message };
      throw error;
    }
  }, [document]);
}

const button =
  "rounded border border-ink-700 bg-ink-900 px-3 py-1 text-sm text-ink-100 hover:border-accent focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-accent disabled:opacity-50";
const primary =
  "rounded bg-accent px-3 py-1 text-sm font-medium text-ink-950 hover:bg-accent-strong focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-accent disabled:opacity-50";

/** The team a board page belongs to; a shared (pinned) board is shown without it. */
export interface BoardTeamRef {
  id: number;
  slug: string;
}

function boardUrl(team: BoardTeamRef, board: SharedBoardDto) {
  return `/api/teams/${team.slug}/boards/${board.id}`;
}

/** Save, keyboard Ctrl/⌘+S, and the side-by-side view when someone saved first. */
function SaveBar({ board, team }: { board: SharedBoardDto; team: BoardTeamRef }) {
  const title = useBoardStore((s) => s.title);
  const version = useBoardStore((s) => s.version);
  const document = useBoardStore((s) => s.document);
  const save = useBoardStore((s) => s.save);
  const setSave = useBoardStore((s) => s.setSave);
  const loaded = useBoardStore((s) => s.loaded);
  const setTitle = useBoardStore((s) => s.setTitle);

  const send = async (basedOn: number) => {
    const checked = boardDocumentSchema.safeParse(document);
    if (!checked.success) {
      setSave({ kind: "error", message: checked.error.issues[0]?.message ?? "The board is not complete." });
      return;
    }
    setSave({ kind: "saving" });
    try {
      const answer = await sendJson<{ board: BoardDto }>("PUT", boardUrl(team, board), {
        version: basedOn,
        title,
        document: checked.data,
      });
      if (answer) loaded(answer.board);
    } catch (error) {
      if (error instanceof VersionConflict) {
        const theirs = error.current as BoardDto;
        setSave({
          kind: "conflict",
          theirs: { version: theirs.version, title: theirs.title, document: theirs.document },
        });
      } else {
        setSave({
          kind: "error",
          message: error instanceof AppError ? error.message : "The board could not be saved. Try again.",
        });
      }
    }
  };

  // Ctrl/⌘+S saves, as in any editor.
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if ((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === "s") {
        e.preventDefault();
        if (save.kind === "unsaved" || save.kind === "error") void send(version);
      }
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  });

  // Leaving with unsaved changes asks first.
  useEffect(() => {
    if (save.kind !== "unsaved" && save.kind !== "conflict") return;
    const onLeave = (e: BeforeUnloadEvent) => e.preventDefault();
    window.addEventListener("beforeunload", onLeave);
    return () => window.removeEventListener("beforeunload", onLeave);
  }, [save.kind]);

  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-center gap-2">
        <input
          aria-label="Board title"
          value={title}
          maxLength={120}
          onChange={(e) => setTitle(e.target.value)}
          className="min-w-0 flex-1 rounded border border-ink-700 bg-ink-950 px-2 py-1 text-lg text-ink-100"
        />
        <button
          type="button"
          className={primary}
          disabled={save.kind === "saved" || save.kind === "saving" || save.kind === "conflict"}
          onClick={() => void send(version)}
        >
          {save.kind === "saving" ? "Saving…" : "Save"}
        </button>
        <span role="status" className="text-xs text-ink-400" data-testid="save-state">
          {save.kind === "saved"
            ? `Saved · version ${version}`
            : save.kind === "unsaved"
              ? "Changes not saved yet (Ctrl+S)"
              : save.kind === "saving"
                ? "Saving…"
                : save.kind === "error"
                  ? ""
                  : "Someone saved first"}
        </span>
      </div>
      {save.kind === "error" && (
        <p role="alert" className="text-sm text-block-launch-punishable">
          {save.message}
        </p>
      )}
      {save.kind === "conflict" && (
        <Conflict
          mine={{ version, title, document }}
          theirs={save.theirs}
          onKeepTheirs={() => loaded(save.theirs)}
          onSaveMine={() => void send(save.theirs.version)}
        />
      )}
    </div>
  );
}

function valueOf(document: BoardDocument): string {
  try {
    return formatPayoff(solveBoard(boardToSolve(document)).value);
  } catch (error) {
    return error instanceof BoardInputError ? "cannot be solved" : "–";
  }
}

function Conflict({
  mine,
  theirs,
  onKeepTheirs,
  onSaveMine,
}: {
  mine: { version: number; title: string; document: BoardDocument };
  theirs: { version: number; title: string; document: BoardDocument };
  onKeepTheirs: () => void;
  onSaveMine: () => void;
}) {
  const sides = [
    { who: "Theirs", copy: theirs, note: `saved as version ${theirs.version}` },
    { who: "Yours", copy: mine, note: `based on version ${mine.version}, not saved` },
  ];
  const changed = mine.document.situations
    .filter((s) => {
      const other = theirs.document.situations.find((t) => t.id === s.id);
      return !other || JSON.stringify(other) !== JSON.stringify(s);
    })
    .map((s) => s.name);
  return (
    <section
      role="alert"
      className="space-y-2 rounded-lg border border-block-punishable/60 p-3 text-sm"
      data-testid="board-conflict"
    >
      <p className="text-ink-100">
        Someone saved this board while you were editing. Nothing of yours was lost: compare and choose.
      </p>
      <div className="grid gap-2 sm:grid-cols-2">
        {sides.map(({ who, copy, note }) => (
          <div key={who} className="rounded border border-ink-700 p-2" data-side={who.toLowerCase()}>
            <h4 className="font-semibold">
              {who} <span className="font-normal text-ink-400">({note})</span>
            </h4>
            <p>Title: {copy.title}</p>
            <p>
              Situations: {copy.document.situations.length} · value{" "}
              <span className="font-mono">{valueOf(copy.document)}</span>
            </p>
            <ul className="list-inside list-disc text-xs text-ink-300">
              {copy.document.situations.map((s) => (
                <li key={s.id}>{s.name}</li>
              ))}
            </ul>
          </div>
        ))}
      </div>
      {changed.length > 0 && <p className="text-ink-300">Situations that differ in yours: {changed.join(", ")}.</p>}
      <div className="flex flex-wrap gap-2">
        <button type="button" className={button} onClick={onKeepTheirs}>
          Keep theirs
        </button>
        <button type="button" className={primary} onClick={onSaveMine}>
          Save mine over theirs
        </button>
      </div>
    </section>
  );
}

function DeleteBoard({ board, team }: { board: SharedBoardDto; team: BoardTeamRef }) {
  const router = useRouter();
  const version = useBoardStore((s) => s.version);
  const setSave = useBoardStore((s) => s.setSave);
  return (
    <button
      type="button"
      className={button}
      onClick={async () => {
        if (!window.confirm(`Delete the board “${board.title}” for the whole team?`)) return;
        try {
          await sendJson("DELETE", `${boardUrl(team, board)}?version=${version}`);
          router.push(`/teams/${team.slug}`);
        } catch (error) {
          setSave({
            kind: "error",
            message: error instanceof AppError ? error.message : "The board could not be deleted. Try again.",
          });
        }
      }}
    >
      Delete board
    </button>
  );
}

interface BoardProps {
  board: SharedBoardDto;
  /** The team the page belongs to; null on a shared link's page (read-only, no way back to the team). */
  team: BoardTeamRef | null;
  canEdit: boolean;
}

function BoardWorkspace({ board, team, canEdit }: BoardProps) {
  const pinned = team === null;
  const document = useBoardStore((s) => s.document);
  const selected = useBoardStore((s) => s.selected);
  const select = useBoardStore((s) => s.select);
  const solved = useSolved(document);
  const solution = solved.ok ? solved.solution : null;
  useEffect(() => finishTimingAfterPaint("board-solve"), [solved]);

  const explorer =
    board.origin &&
    `/games/${board.game.slug}/${board.character.slug}/explore/${encodeURIComponent(board.origin.root)}?edition=${board.edition.slug}${
      board.origin.path ? `&path=${encodeURIComponent(board.origin.path)}` : ""
    }${board.opponent ? `&vs=${board.opponent.id}` : ""}`;

  return (
    <div className="space-y-4" data-testid="board">
      {canEdit && team ? (
        <SaveBar board={board} team={team} />
      ) : (
        <h1 className="text-xl font-semibold">{board.title}</h1>
      )}
      <p className="text-sm text-ink-300">
        {board.character.name}
        {board.opponent ? ` against ${board.opponent.name}` : ""}, {board.game.name} · pinned to Edition{" "}
        {board.edition.name}
        {explorer && !pinned && (
          <>
            {" · "}
            <Link href={explorer} className="text-accent underline">
              Open the path in the Explorer
            </Link>
          </>
        )}
        {!canEdit && !pinned && " · read only: coaches and owners edit boards"}
      </p>
      {team && (
        <div className="flex flex-wrap gap-2">
          <BoardShareButton board={board} teamId={team.id} />
          {canEdit && <DeleteBoard board={board} team={team} />}
        </div>
      )}
      {solved.ok ? (
        <p className="text-sm text-ink-300" data-testid="board-value">
          The board&apos;s value for the attacker:{" "}
          <span className="font-mono text-lg text-accent">{formatPayoff(solved.solution.value)}</span> per exchange,
          solved from the last situations up.
        </p>
      ) : (
        <p
          role="alert"
          className="rounded border border-block-launch-punishable/60 p-2 text-sm"
          data-testid="board-error"
        >
          The board cannot be solved: {solved.message}
        </p>
      )}
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1.3fr)]">
        <div className="space-y-2">
          <nav aria-label="Situations" className="flex flex-wrap gap-1">
            {document.situations.map((s) => (
              <button
                key={s.id}
                type="button"
                aria-current={s.id === selected ? "true" : undefined}
                onClick={() => select(s.id)}
                className={`rounded border px-2 py-0.5 text-xs ${
                  s.id === selected ? "border-accent text-ink-100" : "border-ink-700 text-ink-300"
                }`}
              >
                {s.name}
              </button>
            ))}
          </nav>
          <div className="h-64 rounded-lg border border-ink-800 bg-ink-950 lg:h-[28rem]" data-testid="board-tree">
            <BoardTree document={document} solution={solution} onSelect={select} />
          </div>
        </div>
        <div className="space-y-4">
          <SituationPanel solution={solution?.situations[selected] ?? null} canEdit={canEdit} />
          <ValueTableForm canEdit={canEdit} />
        </div>
      </div>
    </div>
  );
}

/** A Mix-up board: the tree, the open situation's matrix and mixes, and (for coaches) saving. */
export function BoardEditor({ board, team, canEdit }: BoardProps) {
  return (
    <BoardStoreProvider initial={{ title: board.title, version: board.version, document: board.document }}>
      <BoardWorkspace board={board} team={team} canEdit={canEdit && team !== null} />
    </BoardStoreProvider>
  );
}
