"use client";

import { useId, useRef, useState } from "react";
import { useExplorerStore } from "@/components/providers/explorer-store-provider";
import { AppError } from "@/lib/errors";
import { sendJson } from "@/lib/fetcher";
import {
  explorerStateToView,
  PERMALINK_VISIBILITIES,
  VISIBILITY_TEXT,
  type PermalinkVisibility,
} from "@/lib/permalink";

export interface ShareTeam {
  id: number;
  name: string;
}

type Status =
  | { kind: "idle" }
  | { kind: "sending" }
  | { kind: "error"; message: string }
  | { kind: "done"; url: string; copied: "no" | "yes" | "refused" };

const button =
  "rounded border border-ink-700 bg-ink-900 px-3 py-1 text-ink-100 hover:border-accent focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-accent disabled:opacity-50";
const primary =
  "rounded bg-accent px-3 py-1 font-medium text-ink-950 hover:bg-accent-strong focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-accent disabled:opacity-50";

export async function postPermalink(body: unknown): Promise<string> {
  const made = await sendJson<{ permalink?: { path?: unknown } }>("POST", "/api/permalinks", body);
  const path = made?.permalink?.path;
  if (typeof path !== "string")
    throw new AppError("internal", "The server made the link but did not say where it is. Try again.");
  return new URL(path, window.location.origin).toString();
}

/**
 * Share: makes a permalink of what the Explorer shows now, pinned to the
 * Edition on screen.
 */
export function ShareButton({ teams, characterId, root }: { teams: ShareTeam[]; characterId: number; root: string }) {
  const edition = useExplorerStore((s) => s.edition);
  const selected = useExplorerStore((s) => s.selected);
  const options = useExplorerStore((s) => s.options);
  const opponent = useExplorerStore((s) => s.opponent);
  return (
    <ShareDialog
      heading="Share this view"
      pinnedText="The link shows this view pinned to this Edition, so its numbers stay the same after later changes."
      teams={teams}
      make={(teamId, visibility) =>
        postPermalink({
          teamId,
          characterId,
          edition,
          view: explorerStateToView({ selected, options, opponent }, root),
          visibility,
        })
      }
    />
  );
}

/**
 * The Share button and its dialog, for any view: `make` asks the server for the link.
 * A native modal <dialog>: the page behind it is inert (focus stays inside) and Escape
 * closes it. Without `teams` the team is already known (a board belongs to one).
 */
export function ShareDialog({
  heading,
  pinnedText,
  teams,
  make,
}: {
  heading: string;
  pinnedText: string;
  teams: ShareTeam[] | null;
  make: (teamId: number | null, visibility: PermalinkVisibility) => Promise<string>;
}) {
  const dialog = useRef<HTMLDialogElement>(null);
  const linkField = useRef<HTMLInputElement>(null);
  const ids = useId();
  const [teamId, setTeamId] = useState<number | null>(teams?.[0]?.id ?? null);
  const [visibility, setVisibility] = useState<PermalinkVisibility>("team");
  const [status, setStatus] = useState<Status>({ kind: "idle" });

  const open = () => {
    setStatus({ kind: "idle" });
    dialog.current?.showModal();
  };
  const close = () => dialog.current?.close();

  const create = async () => {
    if (teams && teamId === null) return;
    setStatus({ kind: "sending" });
    try {
      const url = await make(teamId, visibility);
      setStatus({ kind: "done", url, copied: "no" });
    } catch (error) {
      setStatus({
        kind: "error",
        message: error instanceof AppError ? error.message : "The link could not be made. Try again.",
      });
    }
  };

  const copy = async (url: string) => {
    try {
      await navigator.clipboard.writeText(url);
      setStatus({ kind: "done", url, copied: "yes" });
    } catch {
      // The browser refused (no permission, or not a secure page): select the text for Ctrl+C.
      linkField.current?.select();
      setStatus({ kind: "done", url, copied: "refused" });
    }
  };

  return (
    <>
      <button type="button" className={button} onClick={open} aria-haspopup="dialog">
        Share
      </button>
      <dialog
        ref={dialog}
        aria-labelledby={`${ids}-title`}
        className="m-auto max-h-[calc(100dvh-2rem)] w-[min(32rem,calc(100vw-2rem))] overflow-y-auto rounded-lg border border-ink-700 bg-ink-850 p-5 text-sm text-ink-100 backdrop:bg-ink-950/70"
      >
        <h2 id={`${ids}-title`} className="mb-3 text-base font-semibold">
          {heading}
        </h2>
        {teams?.length === 0 ? (
          <p className="text-ink-300">
            Links are shared through a team. Create a team or accept an invitation first, then share from here.
          </p>
        ) : status.kind === "done" ? (
          <div className="space-y-3">
            <p className="text-ink-300">{pinnedText}</p>
            <label className="block space-y-1">
              <span className="text-ink-400">Link</span>
              <input
                ref={linkField}
                readOnly
                value={status.url}
                onFocus={(e) => e.currentTarget.select()}
                className="w-full rounded border border-ink-700 bg-ink-900 px-2 py-1 font-mono text-ink-100"
                data-testid="permalink-url"
              />
            </label>
            <div className="flex items-center gap-3">
              <button type="button" className={primary} onClick={() => void copy(status.url)}>
                Copy link
              </button>
              <span role="status" className="text-ink-300">
                {status.copied === "yes"
                  ? "Copied."
                  : status.copied === "refused"
                    ? "Copying was refused by the browser: the link is selected, press Ctrl+C (⌘C on a Mac)."
                    : ""}
              </span>
            </div>
          </div>
        ) : (
          // Not a <form>: the button sits in the Explorer's options form, and forms do not nest.
          <div className="space-y-4">
            {teams && (
              <label className="block space-y-1">
                <span className="text-ink-400">Team</span>
                <select
                  value={teamId ?? ""}
                  onChange={(e) => setTeamId(Number(e.target.value))}
                  className="w-full rounded border border-ink-700 bg-ink-900 px-2 py-1 text-ink-100"
                >
                  {teams.map((t) => (
                    <option key={t.id} value={t.id}>
                      {t.name}
                    </option>
                  ))}
                </select>
              </label>
            )}
            <fieldset className="space-y-2">
              <legend className="mb-1 text-ink-400">Who can open it</legend>
              {PERMALINK_VISIBILITIES.map((v) => (
                <label key={v} className="flex items-start gap-2">
                  <input
                    type="radio"
                    name={`${ids}-visibility`}
                    value={v}
                    checked={visibility === v}
                    onChange={() => setVisibility(v)}
                    className="mt-1 accent-accent"
                  />
                  <span>
                    <span className="block text-ink-100">{VISIBILITY_TEXT[v].label}</span>
                    <span className="block text-ink-400">{VISIBILITY_TEXT[v].explain}</span>
                  </span>
                </label>
              ))}
            </fieldset>
            {status.kind === "error" ? (
              <p role="alert" className="rounded border border-block-launch-punishable/50 p-2 text-ink-100">
                {status.message}
              </p>
            ) : null}
            <button
              type="button"
              className={primary}
              disabled={status.kind === "sending"}
              onClick={() => void create()}
            >
              {status.kind === "sending" ? "Making the link…" : "Make the link"}
            </button>
          </div>
        )}
        <div className="mt-4 flex justify-end">
          <button type="button" className={button} onClick={close}>
            Close
          </button>
        </div>
      </dialog>
    </>
  );
}
