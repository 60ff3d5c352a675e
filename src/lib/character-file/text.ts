import type { FileProblem } from "./problems";
import { MAX_FILE_BYTES } from "./schema";

const MB = (bytes: number) => (bytes / (1024 * 1024)).toFixed(1);

/** Checked on the size a browser or a request reports, before a byte is read. */
export function sizeProblem(size: number): FileProblem | null {
  if (size > MAX_FILE_BYTES) {
    return {
      message: `the file is ${MB(size)} MB; the limit is ${MB(MAX_FILE_BYTES)} MB. Split the Edition into one file per character`,
    };
  }
  return null;
}

/**
 * The file's bytes as text, or why they are not UTF-8 text: too big, empty, UTF-16 (a
 * spreadsheet's "Unicode text"), binary (a NUL byte: no text file has one) or another
 * encoding. A UTF-8 byte order mark is dropped.
 */
export function decodeText(bytes: Uint8Array): { ok: true; text: string } | { ok: false; problem: FileProblem } {
  const tooBig = sizeProblem(bytes.length);
  if (tooBig) return { ok: false, problem: tooBig };
  const wrong = encodingProblem(bytes);
  if (wrong) return { ok: false, problem: wrong };
  // TextDecoder drops a UTF-8 byte order mark itself (ignoreBOM is false by default).
  const text = new TextDecoder("utf-8").decode(bytes);
  if (text.trim() === "") return { ok: false, problem: { message: "the file is empty" } };
  return { ok: true, text };
}

/**
 * Why these bytes are not UTF-8 text, or null. With `partial`, the bytes are only the
 * start of a file (a browser reads the first few kilobytes before streaming the rest to
 * papaparse), so a character cut at the end is not an error.
 */
export function encodingProblem(bytes: Uint8Array, partial = false): FileProblem | null {
  const b0 = bytes[0];
  const b1 = bytes[1];
  if ((b0 === 0xff && b1 === 0xfe) || (b0 === 0xfe && b1 === 0xff) || looksUtf16(bytes)) {
    return { message: "the file is saved as UTF-16; save it again as UTF-8 text (CSV UTF-8, or plain JSON)" };
  }
  if (bytes.includes(0)) {
    return { message: "this is not a text file; export the sheet as CSV (UTF-8) or the data as JSON and try again" };
  }
  try {
    new TextDecoder("utf-8", { fatal: true }).decode(bytes, { stream: partial });
  } catch {
    return { message: "the file is not UTF-8 text (perhaps an older encoding); save it again as UTF-8" };
  }
  return null;
}

/** UTF-16 without a byte order mark: ASCII text then has a NUL in every other byte. */
function looksUtf16(bytes: Uint8Array): boolean {
  const n = Math.min(bytes.length, 512) & ~1;
  if (n < 4) return false;
  let even = 0;
  let odd = 0;
  for (let i = 0; i < n; i += 2) {
    if (bytes[i] === 0) even++;
    if (bytes[i + 1] === 0) odd++;
  }
  const half = n / 2;
  return (even > half * 0.6 && odd < half * 0.1) || (odd > half * 0.6 && even < half * 0.1);
}

/** Drops a byte order mark left on a string (Papa parses strings a caller decoded). */
export function stripBom(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/**
 * How deeply arrays and objects nest in a JSON text, counted without parsing, so a
 * hostile file nested a million levels deep is refused before `JSON.parse` (or a
 * recursive check after it) could exhaust the stack. Stops counting once past `limit`.
 */
export function jsonNestingDepth(text: string, limit: number): number {
  let depth = 0;
  let max = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 0x5c)
        i++; // backslash: skip the escaped character
      else if (c === 0x22) inString = false;
    } else if (c === 0x22) inString = true;
    else if (c === 0x5b || c === 0x7b) {
      depth++;
      if (depth > max) {
        max = depth;
        if (max > limit) return max;
      }
    } else if (c === 0x5d || c === 0x7d) depth--;
  }
  return max;
}
