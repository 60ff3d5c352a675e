import Papa from "papaparse";
import {
  createCsvReader,
  csvDelimiter,
  csvParseConfig,
  encodingProblem,
  formatOf,
  readCharacterFile,
  sizeProblem,
  type FileProblem,
  type ParseResult,
  type ReadOptions,
} from "@/lib/character-file";
import type { ImportAnswer, ImportCounts } from "@/lib/dto";
import { AppError } from "@/lib/errors";

/**
 * The browser's side of importing a character file: the file checked where it is (size before
 * a byte is read, then CSV streamed through papaparse into the same reader the server uses, or
 * JSON read whole), then the file itself sent to the import route, which checks it again.
 */

/** How much of the start of a file is read to find its encoding and its CSV delimiter. */
export const HEAD_BYTES = 4096;
/** papaparse reads a file this much at a time, so a progress bar moves and the page stays responsive. */
export const CHUNK_BYTES = 256 * 1024;

/** Called with how much of the file is read, from 0 to 1. */
export type OnProgress = (fraction: number) => void;

/**
 * The file's line ending, from its first line (the header, which holds no quotes). papaparse
 * would guess it from its first chunk alone, and a chunk that ends inside the header holds
 * none, so a CRLF file would be read with a stray `\r` ending every row.
 */
export function csvLineEnding(head: string): "\r\n" | "\n" | "\r" | undefined {
  const found = /\r\n|\n|\r/.exec(head);
  // A `\r` that ends the head may be the first half of a `\r\n` cut off: let papaparse guess.
  if (!found || (found[0] === "\r" && found.index === head.length - 1)) return undefined;
  return found[0] as "\r\n" | "\n" | "\r";
}

/**
 * Feeds CSV (a browser's File, streamed, or text) row by row to `createCsvReader`, reporting
 * progress by papaparse's cursor over `size` (the file's size, or the text's length).
 */
export function streamCsv(
  source: File | string,
  {
    delimiter,
    newline,
    size,
    onProgress,
    chunkSize = CHUNK_BYTES,
    read,
  }: {
    delimiter: string;
    newline?: "\r\n" | "\n" | "\r";
    size: number;
    onProgress?: OnProgress;
    chunkSize?: number;
    /** The game's way of measuring range, so a label in a numeric game is shown at its line. */
    read?: ReadOptions;
  },
): Promise<ParseResult> {
  const reader = createCsvReader(read);
  let shown = 0;
  return new Promise((resolve) => {
    const config = {
      ...csvParseConfig(delimiter),
      ...(newline === undefined ? {} : { newline }),
      chunkSize,
      step: (row: Papa.ParseStepResult<string[]>) => {
        reader.push(row);
        // The cursor counts characters, the size bytes: close enough for a bar, and capped.
        const fraction = size > 0 ? Math.min(1, row.meta.cursor / size) : 1;
        if (fraction - shown >= 0.01) {
          shown = fraction;
          onProgress?.(fraction);
        }
      },
      complete: () => {
        onProgress?.(1);
        resolve(reader.finish());
      },
      error: () =>
        resolve({
          ok: false,
          problems: [{ message: "the browser could not read the file; check it is still there and choose it again" }],
        }),
    };
    if (typeof source === "string") Papa.parse<string[]>(source, config);
    else Papa.parse<string[]>(source, config);
  });
}

/**
 * Everything the browser can say about a file before it is sent: too large (from its size
 * alone, nothing read), not UTF-8 text, or each problem of its rows with their lines. CSV is
 * streamed; `streamer` is papaparse on the File itself unless a caller passes another.
 */
export async function checkCharacterFile(
  file: File,
  {
    onProgress,
    streamer = streamCsv,
    read,
  }: {
    onProgress?: OnProgress;
    streamer?: (file: File, options: Parameters<typeof streamCsv>[1]) => Promise<ParseResult>;
    read?: ReadOptions;
  } = {},
): Promise<ParseResult> {
  const tooBig = sizeProblem(file.size);
  if (tooBig) return { ok: false, problems: [tooBig] };
  const head = new Uint8Array(await file.slice(0, HEAD_BYTES).arrayBuffer());
  const headText = new TextDecoder().decode(head);
  if (formatOf(file.name, headText) === "json") {
    const result = await readCharacterFile(file, read);
    onProgress?.(1);
    return result;
  }
  const wrong = encodingProblem(head, file.size > HEAD_BYTES);
  if (wrong) return { ok: false, problems: [wrong] };
  return streamer(file, {
    delimiter: csvDelimiter(headText),
    newline: csvLineEnding(headText),
    size: file.size,
    onProgress,
    read,
  });
}

/** What the import route answered: what it would write or wrote, or why not (with every problem of the file). */
export type UploadOutcome =
  { ok: true; answer: ImportAnswer } | { ok: false; status: number; message: string; problems: FileProblem[] };

export function importUrl(game: string, edition: string, character: string, preview: boolean): string {
  const path = [game, "editions", edition, "characters", character].map(encodeURIComponent).join("/");
  return `/api/games/${path}/import${preview ? "?preview=1" : ""}`;
}

/** Sends the file itself (never what the browser made of it) as the form field `file`. */
export async function sendCharacterFile(url: string, file: File): Promise<UploadOutcome> {
  const form = new FormData();
  form.append("file", file, file.name);
  let res: Response;
  try {
    res = await fetch(url, { method: "POST", headers: { accept: "application/json" }, body: form });
  } catch {
    return {
      ok: false,
      status: 0,
      message: "Framefork could not be reached. Check your connection and try again; nothing was imported.",
      problems: [],
    };
  }
  const body: unknown = await res.json().catch(() => null);
  if (res.ok) return { ok: true, answer: body as ImportAnswer };
  const problems = (body as { problems?: unknown } | null)?.problems;
  return {
    ok: false,
    status: res.status,
    message: AppError.fromResponseBody(body, res.status).message,
    problems: Array.isArray(problems) ? (problems as FileProblem[]) : [],
  };
}

// --- Words ----------------------------------------------------------------------------

const PART_WORDS: Record<keyof ImportCounts, [one: string, many: string]> = {
  moves: ["move", "moves"],
  stances: ["stance", "stances"],
  edges: ["connection", "connections"],
};

const countOf = (n: number, part: keyof ImportCounts) => `${n} ${PART_WORDS[part][n === 1 ? 0 : 1]}`;

/** "3 moves and 1 stance added; 1 move changed; nothing removed." (`applied`: what was written). */
export function countsSentence(counts: ImportCounts): string {
  const parts = ["moves", "stances", "edges"] as const;
  const phrase = (what: "added" | "changed" | "removed") => {
    const list = parts.filter((p) => counts[p][what] > 0).map((p) => countOf(counts[p][what], p));
    if (list.length === 0) return null;
    const joined = list.length === 1 ? list[0] : `${list.slice(0, -1).join(", ")} and ${list.at(-1)}`;
    return `${joined} ${what}`;
  };
  const said = (["added", "changed", "removed"] as const).map(phrase).filter((p) => p !== null);
  return said.length === 0 ? "Nothing to change: the file matches what is there." : `${said.join("; ")}.`;
}

/** A field's value as a coach reads it in the old → new list. */
export function showValue(value: unknown): string {
  if (value === null || value === undefined || value === "") return "(empty)";
  if (typeof value === "string") return value;
  if (typeof value === "number") return String(value);
  if (typeof value === "boolean") return value ? "yes" : "no";
  if (Array.isArray(value)) return value.length === 0 ? "(none)" : value.map(showValue).join("; ");
  const outcome = value as { state?: unknown; frames?: unknown };
  if (typeof outcome.state === "string") {
    return typeof outcome.frames === "number" ? `${outcome.state} ${outcome.frames}` : outcome.state;
  }
  return JSON.stringify(value);
}

/** A connection's key (`n>n.v`, or `n.v~ebb>lantern` for a cancel) with an arrow a reader follows. */
export const connectionLabel = (key: string) => key.replace(/>(?=[^>]*$)/, " → ");
