"use client";

import Link from "next/link";
import { useCallback, useEffect, useRef, useState } from "react";
import { useDropzone, type FileRejection } from "react-dropzone";
import { primaryButton } from "@/components/forms/fields";
import { formatProblem, MAX_FILE_BYTES, type FileProblem } from "@/lib/character-file";
import {
  checkCharacterFile,
  connectionLabel,
  countsSentence,
  importUrl,
  sendCharacterFile,
  showValue,
  type UploadOutcome,
} from "@/lib/character-import";
import type { ImportAnswer, ImportCounts, ImportSection } from "@/lib/dto";
import type { RangeScale } from "@/lib/engine";

interface Named {
  slug: string;
  name: string;
}

type Stage =
  | { kind: "idle" }
  | { kind: "reading"; file: File; progress: number }
  | { kind: "refused"; file: File | null; message: string; problems: FileProblem[]; local: boolean }
  | { kind: "previewing"; file: File }
  | { kind: "preview"; file: File; answer: ImportAnswer }
  | { kind: "importing"; file: File; answer: ImportAnswer }
  | { kind: "done"; file: File; answer: ImportAnswer };

const ACCEPT = {
  "text/csv": [".csv"],
  "application/json": [".json"],
};
const secondaryButton = "rounded border border-ink-700 px-3 py-1.5 text-sm text-ink-100 hover:border-ink-400";
const LIMIT_MB = MAX_FILE_BYTES / (1024 * 1024);

/** "merrith.csv has 2 problems: fix them in the file and choose it again." */
function problemsIn(file: File, problems: FileProblem[]): string {
  const n = problems.length;
  return `${file.name} has ${n} problem${n === 1 ? "" : "s"}: fix ${n === 1 ? "it" : "them"} in the file and choose it again.`;
}

/** The server's refusal: its problems listed under our sentence, or its own words when it names none. */
function refusedBy(file: File, sent: Extract<UploadOutcome, { ok: false }>): Stage {
  const message = sent.problems.length > 0 ? `${problemsIn(file, sent.problems)} Nothing was imported.` : sent.message;
  return { kind: "refused", file, local: false, message, problems: sent.problems };
}

/**
 * A character file into a draft Edition: checked in the browser first (size before reading,
 * CSV streamed with a progress bar), then sent to the server for a preview of every change,
 * and written only when the coach presses Import.
 */
export function CharacterImport({
  game,
  character,
  edition,
  range,
}: {
  game: string;
  character: Named;
  edition: Named;
  /** The game's way of measuring range: in a numeric game a label is shown at its line before sending. */
  range: RangeScale;
}) {
  const [stage, setStage] = useState<Stage>({ kind: "idle" });
  const { kind: rangeKind, unit: rangeUnit } = range;
  // Each chosen file gets a number; the answers for a file chosen before are dropped.
  const attempt = useRef(0);
  const resultHeading = useRef<HTMLHeadingElement>(null);

  const check = useCallback(
    async (file: File) => {
      const mine = ++attempt.current;
      const current = () => attempt.current === mine;
      setStage({ kind: "reading", file, progress: 0 });
      const local = await checkCharacterFile(file, {
        read: { range: { kind: rangeKind, unit: rangeUnit } },
        onProgress: (progress) => current() && setStage({ kind: "reading", file, progress }),
      });
      if (!current()) return;
      if (!local.ok) {
        setStage({
          kind: "refused",
          file,
          local: true,
          problems: local.problems,
          message: `${problemsIn(file, local.problems)} Nothing was sent or imported.`,
        });
        return;
      }
      setStage({ kind: "previewing", file });
      const sent = await sendCharacterFile(importUrl(game, edition.slug, character.slug, true), file);
      if (!current()) return;
      setStage(sent.ok ? { kind: "preview", file, answer: sent.answer } : refusedBy(file, sent));
    },
    [game, edition.slug, character.slug, rangeKind, rangeUnit],
  );

  const apply = async (file: File, answer: ImportAnswer) => {
    const mine = ++attempt.current;
    setStage({ kind: "importing", file, answer });
    const sent = await sendCharacterFile(importUrl(game, edition.slug, character.slug, false), file);
    if (attempt.current !== mine) return;
    setStage(sent.ok ? { kind: "done", file, answer: sent.answer } : refusedBy(file, sent));
  };

  const onDrop = useCallback(
    (accepted: File[], rejected: FileRejection[]) => {
      const file = accepted[0];
      if (file && rejected.length === 0) {
        void check(file);
        return;
      }
      attempt.current++;
      const many = accepted.length + rejected.length > 1;
      const name = rejected[0]?.file.name ?? "That file";
      setStage({
        kind: "refused",
        file: null,
        local: true,
        problems: [],
        message: many
          ? "Choose one file at a time: one character per import."
          : `${name} is not a .csv or .json file. Save the sheet as CSV (UTF-8), or use a JSON character file.`,
      });
    },
    [check],
  );

  const busy = stage.kind === "reading" || stage.kind === "previewing" || stage.kind === "importing";
  const { getRootProps, getInputProps, isDragActive } = useDropzone({
    onDrop,
    accept: ACCEPT,
    multiple: false,
    disabled: busy,
  });

  // A result moves the focus to its heading, so keyboard and screen reader users land on it.
  useEffect(() => {
    if (stage.kind === "refused" || stage.kind === "preview" || stage.kind === "done") resultHeading.current?.focus();
  }, [stage.kind]);

  return (
    <div className="space-y-6">
      <div
        {...getRootProps({
          role: "button",
          "aria-label": `Choose a character file to import into ${edition.name}`,
          "aria-describedby": "import-drop-hint",
          "aria-disabled": busy || undefined,
        })}
        className={`flex min-h-36 cursor-pointer flex-col items-center justify-center gap-2 rounded-lg border-2 border-dashed p-6 text-center ${
          isDragActive ? "border-accent bg-ink-850" : "border-ink-700 hover:border-ink-400"
        } ${busy ? "cursor-wait opacity-70" : ""}`}
      >
        <p className="font-medium text-ink-100">
          {isDragActive ? "Drop the file to check it" : "Drop a .csv or .json file here, or choose one"}
        </p>
        <p id="import-drop-hint" className="text-sm text-ink-300">
          Up to {LIMIT_MB} MB, one character. Nothing is written until you have seen what changes and pressed Import.
        </p>
      </div>

      {/* Outside the drop area: an input inside an element with the button role is a control nested in a control. */}
      <input {...getInputProps({ "aria-label": "Character file (.csv or .json)" })} />

      <Progress stage={stage} editionName={edition.name} />

      {stage.kind === "refused" && (
        <Refusal stage={stage} heading={resultHeading} onRetry={stage.file ? () => void check(stage.file!) : null} />
      )}

      {(stage.kind === "preview" || stage.kind === "importing") && (
        <section aria-labelledby="import-preview" className="space-y-4">
          <h2
            id="import-preview"
            ref={resultHeading}
            tabIndex={-1}
            className="text-lg font-semibold focus-visible:outline-none"
          >
            What importing {stage.file.name} into {edition.name} changes
          </h2>
          <Preview answer={stage.answer} />
          <div className="flex flex-wrap items-center gap-3">
            <button
              type="button"
              className={primaryButton}
              disabled={stage.kind === "importing"}
              onClick={() => void apply(stage.file, stage.answer)}
            >
              {stage.kind === "importing" ? "Importing…" : `Import into ${edition.name}`}
            </button>
            <button
              type="button"
              className={secondaryButton}
              disabled={stage.kind === "importing"}
              onClick={() => {
                attempt.current++;
                setStage({ kind: "idle" });
              }}
            >
              Cancel
            </button>
          </div>
        </section>
      )}

      {stage.kind === "done" && (
        <section aria-labelledby="import-done" className="space-y-3 rounded-lg border border-block-plus/50 p-4">
          <h2
            id="import-done"
            ref={resultHeading}
            tabIndex={-1}
            className="text-lg font-semibold focus-visible:outline-none"
          >
            Imported {stage.file.name} into {edition.name}
          </h2>
          <p role="status">{countsSentence(stage.answer.counts)}</p>
          <p>
            <Link href={`/games/${game}/${character.slug}?edition=${edition.slug}`}>
              Open {character.name}’s moves in {edition.name} →
            </Link>
          </p>
        </section>
      )}
    </div>
  );
}

function Progress({ stage, editionName }: { stage: Stage; editionName: string }) {
  if (stage.kind === "reading") {
    const percent = Math.round(stage.progress * 100);
    return (
      <div className="space-y-1" aria-live="polite">
        <p className="text-sm text-ink-300">Checking {stage.file.name}…</p>
        <div
          role="progressbar"
          aria-label={`Checking ${stage.file.name}`}
          aria-valuemin={0}
          aria-valuemax={100}
          aria-valuenow={percent}
          className="h-2 w-full overflow-hidden rounded bg-ink-800"
        >
          <div className="h-full bg-accent transition-[width]" style={{ width: `${percent}%` }} />
        </div>
      </div>
    );
  }
  if (stage.kind === "previewing") {
    return (
      <p role="status" className="animate-pulse text-sm text-ink-300">
        Comparing {stage.file.name} with {editionName}…
      </p>
    );
  }
  return null;
}

function Refusal({
  stage,
  heading,
  onRetry,
}: {
  stage: Extract<Stage, { kind: "refused" }>;
  heading: React.RefObject<HTMLHeadingElement | null>;
  onRetry: (() => void) | null;
}) {
  const retryable = !stage.local && stage.problems.length === 0 && onRetry;
  return (
    <section
      aria-labelledby="import-refused"
      className="space-y-3 rounded-lg border border-block-launch-punishable/60 p-4"
    >
      <h2 id="import-refused" ref={heading} tabIndex={-1} className="text-lg font-semibold focus-visible:outline-none">
        {stage.problems.length > 0 ? "Nothing was imported" : "That did not work"}
      </h2>
      <p role="alert" className="text-ink-100">
        {stage.message}
      </p>
      {stage.problems.length > 0 && (
        <ol aria-label="Problems in the file" className="space-y-1 text-sm">
          {stage.problems.map((p, i) => (
            <li key={i} className="rounded bg-ink-900 px-2 py-1 break-words">
              {formatProblem(p)}
            </li>
          ))}
        </ol>
      )}
      {retryable && (
        <button type="button" className={secondaryButton} onClick={onRetry}>
          Try again
        </button>
      )}
    </section>
  );
}

const PARTS: { part: keyof ImportCounts; title: string; label: (key: string) => string }[] = [
  { part: "moves", title: "Moves", label: (k) => k },
  { part: "stances", title: "Stances", label: (k) => k },
  { part: "edges", title: "Connections (follow-ups, cancels, stance entries)", label: connectionLabel },
];

const VERBS = ["added", "changed", "removed"] as const;

function Preview({ answer }: { answer: ImportAnswer }) {
  const { preview, counts } = answer;
  const removed = counts.moves.removed + counts.stances.removed + counts.edges.removed;
  return (
    <div className="space-y-4">
      <p role="status">{countsSentence(counts)}</p>
      {removed > 0 && (
        <p className="rounded border border-block-punishable/60 px-3 py-2 text-sm text-block-punishable">
          What is in the Edition but not in the file is removed: check the removed rows below before you import.
        </p>
      )}
      <div className="overflow-x-auto">
        <table className="w-full max-w-lg text-sm">
          <caption className="sr-only">Rows added, changed and removed</caption>
          <thead className="text-left text-ink-400">
            <tr>
              <th scope="col" className="py-1 pr-4 font-normal">
                Part
              </th>
              {VERBS.map((verb) => (
                <th key={verb} scope="col" className="py-1 pl-4 text-right font-normal capitalize">
                  {verb}
                </th>
              ))}
            </tr>
          </thead>
          <tbody className="font-mono">
            {PARTS.map(({ part, title }) => (
              <tr key={part} className="border-t border-ink-800">
                <th scope="row" className="py-1 pr-4 text-left font-sans font-normal">
                  {title.split(" (")[0]}
                </th>
                {VERBS.map((verb) => (
                  <td key={verb} className="py-1 pl-4 text-right">
                    {counts[part][verb]}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {PARTS.map(({ part, title, label }) => (
        <PartChanges key={part} title={title} section={preview[part]} label={label} />
      ))}
      {preview.reordered > 0 && (
        <p className="text-sm text-ink-300">
          {preview.reordered} unchanged move{preview.reordered === 1 ? "" : "s"} take a new place in the move list.
        </p>
      )}
      {preview.kept.length > 0 && (
        <p className="text-sm text-ink-300">
          The file gives the character’s {preview.kept.map((k) => k.field).join(" and ")} differently; the character’s
          own details stay as they are.
        </p>
      )}
    </div>
  );
}

function PartChanges({
  title,
  section,
  label,
}: {
  title: string;
  section: ImportSection;
  label: (key: string) => string;
}) {
  if (section.added.length + section.changed.length + section.removed.length === 0) return null;
  const short = title.split(" (")[0]!;
  const id = `import-${short.toLowerCase()}`;
  return (
    <section aria-labelledby={id} className="space-y-2">
      <h3 id={id} className="text-sm font-semibold tracking-wider text-ink-400 uppercase">
        {title}
      </h3>
      {section.added.length > 0 && (
        <KeyList heading="Added" name={`${short}: added`} keys={section.added.map(label)} className="text-block-plus" />
      )}
      {section.changed.length > 0 && (
        <div className="space-y-1">
          <h4 className="text-sm text-ink-300">Changed</h4>
          <ul aria-label={`${short}: changed`} className="space-y-2 text-sm">
            {section.changed.map((c) => (
              <li key={c.key} className="rounded border border-ink-800 p-2">
                <span className="font-mono text-ink-100">{label(c.key)}</span>
                <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5">
                  {c.changes.map((f) => (
                    <div key={f.field} className="contents">
                      <dt className="text-ink-400">{f.field}</dt>
                      <dd className="break-words">
                        <span className="text-ink-300 line-through decoration-ink-400">{showValue(f.before)}</span>
                        {" → "}
                        <span className="text-ink-100">{showValue(f.after)}</span>
                      </dd>
                    </div>
                  ))}
                </dl>
              </li>
            ))}
          </ul>
        </div>
      )}
      {section.removed.length > 0 && (
        <KeyList
          heading="Removed"
          name={`${short}: removed`}
          keys={section.removed.map(label)}
          className="text-block-punishable"
        />
      )}
    </section>
  );
}

function KeyList({
  heading,
  name,
  keys,
  className,
}: {
  heading: string;
  name: string;
  keys: string[];
  className: string;
}) {
  return (
    <div className="space-y-1">
      <h4 className="text-sm text-ink-300">{heading}</h4>
      <ul aria-label={name} className="flex flex-wrap gap-1.5 text-sm">
        {keys.map((k) => (
          <li key={k} className={`rounded border border-ink-700 px-1.5 font-mono ${className}`}>
            {k}
          </li>
        ))}
      </ul>
    </div>
  );
}
