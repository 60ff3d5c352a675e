"use client";

import { useRouter } from "next/navigation";
import { useRef, useState, type ReactNode } from "react";
import { quickFieldText, readQuickField, type QuickField } from "@/lib/edit-forms";
import type { PortableMove, PortableOutcome } from "@/lib/character-file";
import { AppError, VersionConflict } from "@/lib/errors";
import { sendJson } from "@/lib/fetcher";

const LABEL: Record<QuickField, string> = {
  damage: "damage",
  startup: "startup",
  onBlock: "on block",
  onHit: "on hit",
  onCounterHit: "on counter hit",
};

/**
 * One number of a move, fixed in place in a draft's move list (coaches and owners): the cell is a
 * button showing the value; Enter or a click opens a field, Enter saves (based on the version
 * the list was read at), Escape puts it back. If someone saved the move since, both values show
 * and the coach chooses.
 */
export function QuickFix({
  url,
  moveKey,
  version,
  field,
  value,
  children,
}: {
  /** The move's address under the edit routes. */
  url: string;
  moveKey: string;
  version: number;
  field: QuickField;
  value: PortableOutcome | number | null;
  /** The value as the list shows it when not editing. */
  children: ReactNode;
}) {
  const router = useRouter();
  const [editing, setEditing] = useState(false);
  const [text, setText] = useState(quickFieldText(value));
  const [problem, setProblem] = useState<string | null>(null);
  const [theirs, setTheirs] = useState<{ version: number; move: PortableMove } | null>(null);
  const [busy, setBusy] = useState(false);
  const button = useRef<HTMLButtonElement>(null);
  const what = `${LABEL[field]} of ${moveKey}`;

  const close = () => {
    setEditing(false);
    setProblem(null);
    setTheirs(null);
    setText(quickFieldText(value));
    requestAnimationFrame(() => button.current?.focus());
  };

  const save = async (basedOn: number) => {
    const read = readQuickField(field, text);
    if (!read.ok) {
      setProblem(`${LABEL[field]} ${read.message}`);
      return;
    }
    setBusy(true);
    try {
      await sendJson("PATCH", url, { version: basedOn, changes: { [field]: read.value } });
      setEditing(false);
      setTheirs(null);
      router.refresh();
    } catch (error) {
      if (error instanceof VersionConflict) setTheirs(error.current as { version: number; move: PortableMove });
      else setProblem(error instanceof AppError ? error.message : "That did not work. Try again.");
    } finally {
      setBusy(false);
    }
  };

  if (!editing)
    return (
      <button
        ref={button}
        type="button"
        onClick={() => setEditing(true)}
        className="rounded px-0.5 text-left hover:outline hover:outline-1 hover:outline-ink-600"
        aria-label={`Change the ${what}`}
      >
        {children}
      </button>
    );

  return (
    <span className="inline-flex flex-col gap-1">
      <input
        autoFocus
        value={text}
        disabled={busy}
        aria-label={`The ${what}`}
        aria-invalid={problem ? true : undefined}
        onChange={(e) => setText(e.target.value)}
        onKeyDown={(e) => {
          if (e.key === "Enter") {
            e.preventDefault();
            void save(theirs?.version ?? version);
          } else if (e.key === "Escape") {
            e.preventDefault();
            close();
          }
        }}
        className="w-24 rounded border border-ink-700 bg-ink-900 px-1 font-mono text-sm aria-[invalid=true]:border-block-launch-punishable"
      />
      {problem && (
        <span role="alert" className="text-xs whitespace-normal text-ink-100">
          {problem}
        </span>
      )}
      {theirs && (
        <span role="alert" className="space-y-1 text-xs whitespace-normal" data-testid="quick-fix-conflict">
          <span className="block">
            Someone saved {moveKey} since: theirs {quickFieldText(theirs.move[field])}, yours {text}.
          </span>
          <span className="flex gap-1">
            <button
              type="button"
              className="rounded border border-ink-700 px-1"
              onClick={() => {
                setText(quickFieldText(theirs.move[field]));
                setTheirs(null);
                router.refresh();
                setEditing(false);
              }}
            >
              Keep theirs
            </button>
            <button
              type="button"
              className="rounded border border-ink-700 px-1"
              onClick={() => void save(theirs.version)}
            >
              Save mine
            </button>
          </span>
        </span>
      )}
    </span>
  );
}
