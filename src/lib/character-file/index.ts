/**
 * Characters in and out of files: Framefork's own CSV and JSON formats (README, "Bring your
 * own game"). Pure code, for the server and the browser alike: no database, no routes.
 *
 * Server: `readCharacterFile(file)` (a form's File: size checked before reading), or
 * `parseCharacterFile(name, bytes)`. A browser streaming a large CSV with progress:
 *
 *   const head = new Uint8Array(await file.slice(0, 4096).arrayBuffer());
 *   const problem = sizeProblem(file.size) ?? encodingProblem(head, true);
 *   const reader = createCsvReader();
 *   Papa.parse(file, { ...csvParseConfig(csvDelimiter(new TextDecoder().decode(head))),
 *     step: (r) => reader.push(r), complete: () => show(reader.finish()) });
 */
import { createCsvReader, exportCharacterCsv, exportEditionCsv, parseCharactersCsv } from "./csv";
import { exportCharacterJson, exportEditionJson, parseCharactersJson } from "./json";
import type { ParseResult } from "./problems";
import { decodeText, encodingProblem, sizeProblem } from "./text";
import type { ReadOptions } from "./validate";

export {
  CHARACTER_FORMAT,
  EDITION_FORMAT,
  FORMAT_VERSION,
  MAX_FILE_BYTES,
  POSTURES,
  edgeKey,
  moveNode,
  orderEdges,
  stanceNodeId,
  toMoveGraph,
  keySchema,
  portableCancelSchema,
  portableEdgeSchema,
  portableEnterSchema,
  portableFollowSchema,
  portableMoveSchema,
  portableStanceSchema,
  characterInfoSchema,
  type CharacterInfo,
  type PortableCharacter,
  type PortableEdge,
  type PortableMove,
  type PortableStance,
  type PortableOutcome,
} from "./schema";
export { coachErrorMap, formatProblem, MAX_PROBLEMS, type FileProblem, type ParseResult } from "./problems";
export {
  CSV_COLUMNS,
  ROW_KINDS,
  csvDelimiter,
  csvParseConfig,
  outcomeCell,
  outcomeText,
  protectCell,
  unprotectCell,
  type CsvReader,
  type CsvStep,
} from "./csv";
export { MAX_JSON_DEPTH } from "./json";
export { validateCharacter, type ReadOptions } from "./validate";
export { decodeText, encodingProblem, sizeProblem };
export {
  createCsvReader,
  exportCharacterCsv,
  exportEditionCsv,
  exportCharacterJson,
  exportEditionJson,
  parseCharactersCsv,
  parseCharactersJson,
};

export type FileFormat = "csv" | "json";

/** By the name's extension; without one, by the first character (`{` is JSON). */
export function formatOf(name: string, text: string): FileFormat {
  const ext = /\.([a-z0-9]+)$/i.exec(name)?.[1]?.toLowerCase();
  if (ext === "json") return "json";
  if (ext === "csv" || ext === "tsv" || ext === "txt") return "csv";
  return text.trimStart().startsWith("{") ? "json" : "csv";
}

/** A file's bytes (already read) as characters, or the problems with it. */
export function parseCharacterFile(name: string, bytes: Uint8Array, options: ReadOptions = {}): ParseResult {
  const decoded = decodeText(bytes);
  if (!decoded.ok) return { ok: false, problems: [decoded.problem] };
  return formatOf(name, decoded.text) === "json"
    ? parseCharactersJson(decoded.text, options)
    : parseCharactersCsv(decoded.text, options);
}

/**
 * A file as a browser's `File` or a request's form field gives it: its size is checked
 * before a byte is read, so an oversized upload is refused without holding it in memory.
 */
export async function readCharacterFile(
  file: {
    name: string;
    size: number;
    arrayBuffer(): Promise<ArrayBuffer>;
  },
  options: ReadOptions = {},
): Promise<ParseResult> {
  const tooBig = sizeProblem(file.size);
  if (tooBig) return { ok: false, problems: [tooBig] };
  return parseCharacterFile(file.name, new Uint8Array(await file.arrayBuffer()), options);
}
