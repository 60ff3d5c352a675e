import Papa from "papaparse";
import { STATES } from "../engine/schema";
import { duplicateSlugs } from "./json";
import { capProblems, type FileProblem, type ParseResult } from "./problems";
import { type PortableCharacter, type PortableEdge, type PortableMove, type PortableOutcome } from "./schema";
import { stripBom } from "./text";
import { validateCharacter, type Locate, type Part, type RawCharacter, type ReadOptions, type Where } from "./validate";

/**
 * Framefork's CSV format: one row per thing a coach writes down, told apart by the `row`
 * column (see README, "Bring your own game"):
 *
 *   character  key = the character's slug, name, notes = its summary
 *   stance     key, name, abbreviation, notes
 *   move       the move (key, input, name, level, damage, startup, on_block, on_hit,
 *              on_counter_hit, range, tags, from_posture, stance, notes) and the way into it:
 *              from = the move it follows or the stance it is entered from, edge_input, and
 *              for a follow gap_on_block, combo_on_hit, combo_on_counter_hit
 *   cancel     from = the move cancelled, edge_input, stance = the stance it ends in,
 *              on_block, on_hit, on_counter_hit, auto_guard
 *   follow /   a second way into a move (rare): key = the move, from, edge_input (and the
 *   enter      follow's gap and combos)
 *
 * A whole Edition adds a `character` column naming each row's character by slug.
 */

export const CSV_COLUMNS = [
  "row",
  "key",
  "input",
  "name",
  "level",
  "damage",
  "startup",
  "on_block",
  "on_hit",
  "on_counter_hit",
  "range",
  "tags",
  "from_posture",
  "stance",
  "from",
  "edge_input",
  "gap_on_block",
  "combo_on_hit",
  "combo_on_counter_hit",
  "auto_guard",
  "abbreviation",
  "notes",
] as const;
export type CsvColumn = (typeof CSV_COLUMNS)[number] | "character";

/** Columns a file may leave out: what they hold is optional, or needed by stances and cancels only. */
const OPTIONAL: readonly CsvColumn[] = [
  "range",
  "tags",
  "from_posture",
  "stance",
  "auto_guard",
  "abbreviation",
  "notes",
];
const REQUIRED: readonly CsvColumn[] = CSV_COLUMNS.filter((c) => !OPTIONAL.includes(c));

export const ROW_KINDS = ["character", "stance", "move", "cancel", "follow", "enter"] as const;
type RowKind = (typeof ROW_KINDS)[number];

/** The columns each kind of row fills; any other column must be empty on it. */
const USES: Record<RowKind, readonly CsvColumn[]> = {
  character: ["key", "name", "notes"],
  stance: ["key", "name", "abbreviation", "notes"],
  // Every column but the row's kind and those of stances and cancels alone.
  move: CSV_COLUMNS.filter((c) => c !== "row" && c !== "abbreviation" && c !== "auto_guard"),
  cancel: ["from", "edge_input", "stance", "on_block", "on_hit", "on_counter_hit", "auto_guard"],
  follow: ["key", "from", "edge_input", "gap_on_block", "combo_on_hit", "combo_on_counter_hit"],
  enter: ["key", "from", "edge_input"],
};

// --- Cells -----------------------------------------------------------------------------

/**
 * Characters that make a spreadsheet read a cell as a formula (OWASP, "CSV Injection"), and
 * the quote we prefix them with. A value that itself starts with a quote gets one too, so
 * that import can strip exactly one quote from every cell that has one and give back the
 * value as it was.
 */
const FORMULA_START = /^[=+\-@\t\r']/;

export function protectCell(value: string): string {
  return FORMULA_START.test(value) ? `'${value}` : value;
}

export function unprotectCell(cell: string): string {
  return cell.startsWith("'") ? cell.slice(1) : cell;
}

const WHOLE = /^[+-]?\d+$/;
const DECIMAL = /^[+-]?(?:\d+\.\d*|\.\d+)$/;
const STATE_CELL = /^([a-z-]+)(?:\s+([+-]?\d+(?:\.\d+)?))?$/i;

/** A number, or the cell as it was so the schema can say what is wrong with it. */
function numberCell(cell: string): number | string {
  return WHOLE.test(cell) || DECIMAL.test(cell) ? Number(cell) : cell;
}

/** `-3`, `+2`, `knockdown`, `knockdown 5`, `throw -2`. */
export function outcomeCell(cell: string): PortableOutcome | string {
  if (WHOLE.test(cell) || DECIMAL.test(cell)) return Number(cell);
  const m = STATE_CELL.exec(cell);
  const state = m?.[1]?.toLowerCase();
  if (!m || !(STATES as readonly string[]).includes(state ?? "")) return cell;
  return m[2] === undefined ? ({ state } as PortableOutcome) : ({ state, frames: Number(m[2]) } as PortableOutcome);
}

export function outcomeText(o: PortableOutcome): string | number {
  if (typeof o === "number") return o;
  return o.frames === undefined ? o.state : `${o.state} ${o.frames}`;
}

const YES = new Set(["yes", "y", "true", "1"]);
const NO = new Set(["no", "n", "false", "0"]);
function booleanCell(cell: string): boolean | string {
  const c = cell.toLowerCase();
  return YES.has(c) ? true : NO.has(c) ? false : cell;
}

function listCell(cell: string): string[] {
  return cell
    .split(";")
    .map((s) => s.trim())
    .filter((s) => s !== "");
}

/** A header as a spreadsheet user may write it: `On Block`, `on-block` and `on_block` are one column. */
export function normaliseHeader(cell: string): string {
  return stripBom(cell)
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, "_");
}

// --- Reading ---------------------------------------------------------------------------

interface Row {
  line: number;
  cells: string[];
}

const LINE_BREAKS = /\r\n|\r|\n/g;

/** One step of papaparse's row stream (`step`'s argument), reduced to what the reader needs. */
export interface CsvStep {
  data: string[];
  errors?: readonly Pick<Papa.ParseError, "code" | "message">[];
}

export interface CsvReader {
  /** Feed one parsed row, in file order (papaparse `step` with `header: false`, `skipEmptyLines: false`). */
  push(step: CsvStep): void;
  /** The rows read so far (for a progress bar). */
  readonly rows: number;
  /** Validates what was pushed. */
  finish(): ParseResult;
}

/**
 * The CSV format's row-by-row reader. The server feeds it from `Papa.parse` on a string;
 * a browser can feed it from `Papa.parse(file, { step })` and show progress as rows come.
 * Pass `skipEmptyLines: false`: the reader counts blank lines itself to keep line numbers true.
 */
export function createCsvReader(options: ReadOptions = {}): CsvReader {
  let nextLine = 1;
  let header: { line: number; names: string[] } | null = null;
  const rows: Row[] = [];
  const problems: FileProblem[] = [];

  return {
    get rows() {
      return rows.length;
    },
    push(step) {
      const line = nextLine;
      for (const cell of step.data) nextLine += cell.match(LINE_BREAKS)?.length ?? 0;
      nextLine += 1;
      for (const e of step.errors ?? []) {
        if (e.code === "MissingQuotes") {
          problems.push({ line, message: 'a quoted cell starts on this line but its closing quote (") is missing' });
        } else if (e.code === "InvalidQuotes") {
          problems.push({
            line,
            message: 'a stray quote ("); put the whole cell in quotes and double the quote inside ("")',
          });
        }
      }
      if (step.data.every((c) => c.trim() === "")) return;
      if (header === null) header = { line, names: step.data.map(normaliseHeader) };
      else rows.push({ line, cells: step.data });
    },
    finish() {
      if (header === null) return { ok: false, problems: [{ message: "the file is empty" }] };
      if (problems.length > 0) return { ok: false, problems: capProblems(problems) };
      return readRows(header, rows, options);
    },
  };
}

/**
 * The delimiter, read from the header line alone: a spreadsheet set to a language that
 * writes decimal commas saves `;` instead of `,`. Guessing from the data (as papaparse
 * can) is fooled by notes full of semicolons; the header holds only column names.
 */
export function csvDelimiter(start: string): "," | ";" | "\t" {
  const header = stripBom(start).split(/\r\n|\r|\n/, 1)[0] ?? "";
  const count = (d: string) => header.split(d).length - 1;
  const best = ([";", "\t"] as const).find((d) => count(d) > count(","));
  return best ?? ",";
}

/**
 * papaparse's settings for the reader; a browser passes the same with `step` to stream a
 * file, and the delimiter from `csvDelimiter` on its first few kilobytes.
 */
export const csvParseConfig = (delimiter: string) => ({ header: false, skipEmptyLines: false, delimiter }) as const;

/** Parses a character or a whole Edition from CSV text (a string, on the server). */
export function parseCharactersCsv(input: string, options: ReadOptions = {}): ParseResult {
  const text = stripBom(input);
  if (text.trim() === "") return { ok: false, problems: [{ message: "the file is empty" }] };
  const reader = createCsvReader(options);
  Papa.parse<string[]>(text, { ...csvParseConfig(csvDelimiter(text)), step: (r) => reader.push(r) });
  return reader.finish();
}

interface Bucket {
  slug: string | null;
  characterRows: Row[];
  raw: RawCharacter;
  lines: Record<Exclude<Part, "character">, Row[]>;
  /** The column that holds each edge's `to`. */
  edgeTo: CsvColumn[];
}

const FIELD_COLUMN: Record<string, CsvColumn> = {
  key: "key",
  input: "input",
  name: "name",
  level: "level",
  damage: "damage",
  startup: "startup",
  onBlock: "on_block",
  onHit: "on_hit",
  onCounterHit: "on_counter_hit",
  range: "range",
  tags: "tags",
  fromPosture: "from_posture",
  stance: "stance",
  notes: "notes",
  abbreviation: "abbreviation",
  from: "from",
  gapOnBlock: "gap_on_block",
  comboOnHit: "combo_on_hit",
  comboOnCounterHit: "combo_on_counter_hit",
  autoGuard: "auto_guard",
  kind: "row",
};

function readRows(header: { line: number; names: string[] }, rows: Row[], options: ReadOptions): ParseResult {
  const problems: FileProblem[] = [];
  const known = new Set<string>([...CSV_COLUMNS, "character"]);
  const index = new Map<CsvColumn, number>();
  header.names.forEach((name, i) => {
    if (name === "") return;
    if (!known.has(name)) {
      problems.push({
        line: header.line,
        message: `unknown column "${name}"; the columns are ${CSV_COLUMNS.join(", ")} (and character for several characters)`,
      });
    } else if (index.has(name as CsvColumn)) {
      problems.push({ line: header.line, message: `the column "${name}" appears twice` });
    } else index.set(name as CsvColumn, i);
  });
  const missing = REQUIRED.filter((c) => !index.has(c));
  if (!index.has("row")) {
    return {
      ok: false,
      problems: [
        {
          line: header.line,
          message: `the first line must name the columns (${CSV_COLUMNS.join(", ")}); this file's first line is not that header`,
        },
      ],
    };
  }
  if (missing.length > 0) {
    problems.push({
      line: header.line,
      message: `missing column${missing.length > 1 ? "s" : ""} ${missing.join(", ")}`,
    });
  }
  if (problems.length > 0) return { ok: false, problems: capProblems(problems) };

  const cell = (row: Row, column: CsvColumn): string => {
    const i = index.get(column);
    return i === undefined ? "" : unprotectCell(row.cells[i] ?? "");
  };
  const value = (row: Row, column: CsvColumn) => {
    const c = cell(row, column);
    return c.trim() === "" ? undefined : c;
  };

  const buckets = new Map<string | null, Bucket>();
  const bucket = (slug: string | null): Bucket => {
    let b = buckets.get(slug);
    if (!b) {
      b = {
        slug,
        characterRows: [],
        raw: { character: undefined, stances: [], moves: [], edges: [] },
        lines: { stances: [], moves: [], edges: [] },
        edgeTo: [],
      };
      buckets.set(slug, b);
    }
    return b;
  };
  const byCharacter = index.has("character");
  const widest = Math.max(...index.values()) + 1;

  // First pass: sort rows by kind and character, so `from` can name a key defined later.
  const sorted: { row: Row; kind: RowKind; bucket: Bucket }[] = [];
  for (const row of rows) {
    const extra = row.cells.slice(Math.max(widest, header.names.length)).some((c) => c.trim() !== "");
    if (extra) problems.push({ line: row.line, message: "this row has more cells than the header has columns" });
    const kindCell = (value(row, "row") ?? "").trim().toLowerCase();
    const kind = ROW_KINDS.find((k) => k === kindCell);
    if (!kind) {
      problems.push({
        line: row.line,
        column: "row",
        message:
          kindCell === ""
            ? `row is empty; write what the row is: ${ROW_KINDS.join(", ")}`
            : `"${kindCell}" is not a kind of row; use ${ROW_KINDS.join(", ")}`,
      });
      continue;
    }
    for (const column of index.keys()) {
      if (column === "row" || column === "character" || USES[kind].includes(column)) continue;
      if (value(row, column) !== undefined) {
        problems.push({
          line: row.line,
          column,
          message: `${column} is not used on a ${kind} row; leave it empty`,
        });
      }
    }
    let slug: string | null = null;
    if (byCharacter) {
      slug =
        (kind === "character" ? (value(row, "character") ?? value(row, "key")) : value(row, "character"))?.trim() ??
        null;
      if (
        kind === "character" &&
        value(row, "character") !== undefined &&
        value(row, "character")?.trim() !== value(row, "key")?.trim()
      ) {
        problems.push({
          line: row.line,
          column: "character",
          message: "on a character row, character and key must be the same slug",
        });
      }
      if (slug === null) {
        problems.push({
          line: row.line,
          column: "character",
          message: "character is empty; write the slug of the character this row belongs to",
        });
        continue;
      }
    }
    sorted.push({ row, kind, bucket: bucket(slug) });
  }

  for (const { row, kind, bucket: b } of sorted) {
    if (kind === "character") b.characterRows.push(row);
  }

  // Keys each character defines, so a move row's `from` can tell a move from a stance.
  const keysOf = new Map<Bucket, { moves: Set<string>; stances: Set<string> }>();
  for (const { row, kind, bucket: b } of sorted) {
    const k = keysOf.get(b) ?? { moves: new Set<string>(), stances: new Set<string>() };
    keysOf.set(b, k);
    if (kind === "move") {
      const key = (value(row, "key") ?? value(row, "input"))?.trim();
      if (key) k.moves.add(key);
    } else if (kind === "stance") {
      const key = value(row, "key")?.trim();
      if (key) k.stances.add(key);
    }
  }

  for (const { row, kind, bucket: b } of sorted) {
    if (kind === "character") continue;
    if (b.slug !== null && !buckets.get(b.slug)?.characterRows.length) continue; // reported below
    if (kind === "stance") {
      b.raw.stances.push({
        key: value(row, "key"),
        name: value(row, "name"),
        abbreviation: value(row, "abbreviation"),
        notes: value(row, "notes"),
      });
      b.lines.stances.push(row);
      continue;
    }
    if (kind === "move") {
      const move = {
        key: value(row, "key"),
        input: value(row, "input"),
        name: value(row, "name"),
        level: value(row, "level")?.trim().toLowerCase(),
        damage: numberOrUndefined(value(row, "damage")),
        startup: numberOrUndefined(value(row, "startup")),
        onBlock: outcomeOrUndefined(value(row, "on_block")),
        onHit: outcomeOrUndefined(value(row, "on_hit")),
        onCounterHit: outcomeOrUndefined(value(row, "on_counter_hit")),
        range: value(row, "range"),
        tags: listCell(cell(row, "tags")),
        fromPosture: value(row, "from_posture")?.trim().toLowerCase(),
        stance: value(row, "stance"),
        notes: value(row, "notes"),
      };
      b.raw.moves.push(move);
      b.lines.moves.push(row);
      const from = value(row, "from")?.trim();
      if (from === undefined) {
        for (const c of ["edge_input", "gap_on_block", "combo_on_hit", "combo_on_counter_hit"] as const) {
          if (value(row, c) !== undefined) {
            problems.push({
              line: row.line,
              column: c,
              message: `${c} describes the way into this move, but from is empty; fill in from or leave ${c} empty`,
            });
          }
        }
        continue;
      }
      const to = (move.key ?? move.input)?.trim();
      const keys = keysOf.get(b)!;
      // A key that is both is reported as such; reading it as the stance avoids a second message.
      const edgeKind = keys.stances.has(from) ? "enter" : keys.moves.has(from) ? "follow" : null;
      if (edgeKind === null) {
        problems.push({ line: row.line, column: "from", message: `no move or stance has the key "${from}"` });
        continue;
      }
      pushEdge(b, row, edgeKind, from, to, "key");
      continue;
    }
    if (kind === "cancel") {
      b.raw.edges.push({
        kind,
        from: value(row, "from"),
        to: value(row, "stance"),
        input: value(row, "edge_input"),
        onBlock: outcomeOrUndefined(value(row, "on_block")),
        onHit: outcomeOrUndefined(value(row, "on_hit")),
        onCounterHit: outcomeOrUndefined(value(row, "on_counter_hit")),
        autoGuard: listCell(cell(row, "auto_guard")).map((l) => l.toLowerCase()),
      });
      b.lines.edges.push(row);
      b.edgeTo.push("stance");
      continue;
    }
    pushEdge(b, row, kind, value(row, "from"), value(row, "key"), "key");
  }

  function pushEdge(
    b: Bucket,
    row: Row,
    kind: "follow" | "enter",
    from: string | undefined,
    to: string | undefined,
    toColumn: CsvColumn,
  ) {
    b.raw.edges.push(
      kind === "follow"
        ? {
            kind,
            from,
            to,
            input: value(row, "edge_input"),
            gapOnBlock: numberOrUndefined(value(row, "gap_on_block")),
            comboOnHit: booleanOrUndefined(value(row, "combo_on_hit")),
            comboOnCounterHit: booleanOrUndefined(value(row, "combo_on_counter_hit")),
          }
        : { kind, from, to, input: value(row, "edge_input") },
    );
    if (kind === "enter") {
      for (const c of ["gap_on_block", "combo_on_hit", "combo_on_counter_hit"] as const) {
        if (value(row, c) !== undefined) {
          problems.push({
            line: row.line,
            column: c,
            message: `${c} is for a move that follows a hit; this move is entered from a stance, so leave it empty`,
          });
        }
      }
    }
    b.lines.edges.push(row);
    b.edgeTo.push(toColumn);
  }

  const characters: PortableCharacter[] = [];
  const characterLines: number[] = [];
  for (const b of buckets.values()) {
    const first = b.characterRows[0];
    if (!first) {
      const rowsOf = sorted.filter((s) => s.bucket === b);
      problems.push({
        line: rowsOf[0]?.row.line,
        ...(b.slug === null ? {} : { column: "character" }),
        message:
          b.slug === null
            ? "the file has no character row: add one with row = character, key = the character's slug (e.g. night-owl) and name"
            : `no character row has the slug "${b.slug}"`,
      });
      continue;
    }
    for (const extra of b.characterRows.slice(1)) {
      problems.push({
        line: extra.line,
        message: byCharacter
          ? `a second character row for "${b.slug}"`
          : "a second character row; to put several characters in one file, add a character column naming each row's character",
      });
    }
    b.raw.character = { slug: value(first, "key"), name: value(first, "name"), summary: value(first, "notes") };
    const locate: Locate = (part, i, field = []) => {
      const f = typeof field[0] === "string" ? field[0] : undefined;
      if (part === "character") {
        const column: CsvColumn = f === "summary" ? "notes" : f === "slug" ? "key" : ((f as CsvColumn) ?? "key");
        return { line: first.line, ...(f ? { column } : {}) };
      }
      const row = b.lines[part][i];
      let column: CsvColumn | undefined = f === undefined ? undefined : FIELD_COLUMN[f];
      if (part === "edges" && f === "to") column = b.edgeTo[i];
      if (part === "edges" && f === "input") column = "edge_input";
      const w: Where = { line: row?.line };
      return column === undefined ? w : { ...w, column };
    };
    const r = validateCharacter(b.raw, locate, options);
    if (r.character) {
      characters.push(r.character);
      characterLines.push(first.line);
    } else problems.push(...r.problems);
  }
  problems.push(...duplicateSlugs(characters, (i) => ({ line: characterLines[i], column: "key" })));
  if (problems.length > 0) {
    problems.sort((a, b) => (a.line ?? 0) - (b.line ?? 0));
    return { ok: false, problems: capProblems(problems) };
  }
  return { ok: true, characters };
}

const numberOrUndefined = (c: string | undefined) => (c === undefined ? undefined : numberCell(c.trim()));
const outcomeOrUndefined = (c: string | undefined) => (c === undefined ? undefined : outcomeCell(c.trim()));
const booleanOrUndefined = (c: string | undefined) => (c === undefined ? undefined : booleanCell(c.trim()));

// --- Writing ---------------------------------------------------------------------------

type Cell = string | number;

function rowsOf(c: PortableCharacter): Partial<Record<CsvColumn, Cell>>[] {
  const out: Partial<Record<CsvColumn, Cell>>[] = [];
  out.push({ row: "character", key: c.character.slug, name: c.character.name, notes: c.character.summary ?? "" });
  for (const s of c.stances) {
    out.push({ row: "stance", key: s.key, name: s.name, abbreviation: s.abbreviation, notes: s.notes ?? "" });
  }
  const incoming = new Map<string, PortableEdge[]>();
  const cancels = new Map<string, PortableEdge[]>();
  for (const e of c.edges) {
    const [map, at] = e.kind === "cancel" ? [cancels, e.from] : [incoming, e.to];
    map.set(at, [...(map.get(at) ?? []), e]);
  }
  const edgeCells = (e: PortableEdge): Partial<Record<CsvColumn, Cell>> =>
    e.kind === "follow"
      ? {
          from: e.from,
          edge_input: e.input,
          gap_on_block: e.gapOnBlock,
          combo_on_hit: e.comboOnHit ? "yes" : "no",
          combo_on_counter_hit: e.comboOnCounterHit ? "yes" : "no",
        }
      : { from: e.from, edge_input: e.input };
  for (const m of c.moves) {
    const [first, ...more] = incoming.get(m.key) ?? [];
    out.push({ row: "move", ...moveCells(m), ...(first ? edgeCells(first) : {}) });
    for (const e of more) out.push({ row: e.kind, key: m.key, ...edgeCells(e) });
    for (const e of cancels.get(m.key) ?? []) {
      if (e.kind !== "cancel") continue;
      out.push({
        row: "cancel",
        from: e.from,
        edge_input: e.input,
        stance: e.to,
        on_block: outcomeText(e.onBlock),
        on_hit: outcomeText(e.onHit),
        on_counter_hit: outcomeText(e.onCounterHit),
        auto_guard: e.autoGuard.join("; "),
      });
    }
  }
  return out;
}

function moveCells(m: PortableMove): Partial<Record<CsvColumn, Cell>> {
  return {
    key: m.key,
    input: m.input,
    name: m.name,
    level: m.level,
    damage: m.damage,
    startup: m.startup ?? "",
    on_block: outcomeText(m.onBlock),
    on_hit: outcomeText(m.onHit),
    on_counter_hit: outcomeText(m.onCounterHit),
    range: m.range ?? "",
    tags: m.tags.join("; "),
    from_posture: m.fromPosture,
    stance: m.stance ?? "",
    notes: m.notes ?? "",
  };
}

/** Text cells are protected against formulas; numbers stay numbers. CRLF line ends, as RFC 4180 has them. */
function unparse(columns: readonly CsvColumn[], rows: Partial<Record<CsvColumn, Cell>>[]): string {
  const data = rows.map((r) =>
    columns.map((c) => {
      const v = r[c] ?? "";
      return typeof v === "number" ? v : protectCell(v);
    }),
  );
  return `${Papa.unparse({ fields: [...columns], data }, { newline: "\r\n", escapeFormulae: false })}\r\n`;
}

/** One character as CSV text. */
export function exportCharacterCsv(c: PortableCharacter): string {
  return unparse(CSV_COLUMNS, rowsOf(c));
}

/** A whole Edition as one CSV text, with a `character` column naming each row's character. */
export function exportEditionCsv(characters: readonly PortableCharacter[]): string {
  const rows = characters.flatMap((c) => rowsOf(c).map((r) => ({ character: c.character.slug, ...r })));
  return unparse(["character", ...CSV_COLUMNS], rows);
}
