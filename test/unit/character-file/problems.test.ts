import { readFileSync } from "node:fs";
import { join } from "node:path";
import Papa from "papaparse";
import { describe, expect, test } from "vitest";
import {
  CSV_COLUMNS,
  MAX_FILE_BYTES,
  createCsvReader,
  csvDelimiter,
  csvParseConfig,
  encodingProblem,
  formatProblem,
  parseCharacterFile,
  parseCharactersCsv,
  parseCharactersJson,
  readCharacterFile,
  type FileProblem,
  type ParseResult,
} from "../../../src/lib/character-file";

// Every bad file here gets a list of problems, each saying where (a CSV line and column,
// or a JSON path) and what is wrong. Common practice, no source: a coach fixes a file from
// the message alone.

const examples = join(__dirname, "../../../public/examples");
const exampleJson = () => readFileSync(join(examples, "merrith.json"), "utf8");

const problemsOf = (r: ParseResult): FileProblem[] => {
  if (r.ok) throw new Error("expected the file to be refused");
  return r.problems;
};
const texts = (r: ParseResult) => problemsOf(r).map(formatProblem);
const bytes = (s: string) => new TextEncoder().encode(s);

type Cells = Partial<Record<(typeof CSV_COLUMNS)[number] | "character", string>>;
const HEADER = CSV_COLUMNS.join(",");
const csvRow = (cells: Cells, columns: readonly string[] = CSV_COLUMNS) =>
  columns.map((c) => Papa.unparse([[cells[c as keyof Cells] ?? ""]])).join(",");

/** A small valid character: rows 2.. of the file, in order. */
const ROWS: Cells[] = [
  { row: "character", key: "pell", name: "Pell" },
  { row: "stance", key: "hush", name: "Hush", abbreviation: "HSH" },
  {
    row: "move",
    key: "1",
    input: "1",
    name: "Tap",
    level: "high",
    damage: "7",
    startup: "10",
    on_block: "1",
    on_hit: "8",
    on_counter_hit: "8",
  },
  {
    row: "move",
    key: "1,2",
    input: "1,2",
    name: "Tap Tap",
    level: "mid",
    damage: "9",
    on_block: "-4",
    on_hit: "knockdown",
    on_counter_hit: "knockdown 3",
    from: "1",
    edge_input: ",2",
    gap_on_block: "2",
    combo_on_hit: "yes",
    combo_on_counter_hit: "yes",
  },
  {
    row: "cancel",
    from: "1,2",
    edge_input: "~b",
    stance: "hush",
    on_block: "0",
    on_hit: "5",
    on_counter_hit: "5",
    auto_guard: "high; mid",
  },
  {
    row: "move",
    key: "HSH:2",
    input: "HSH:2",
    name: "Hush Palm",
    level: "mid",
    damage: "12",
    startup: "13",
    on_block: "-3",
    on_hit: "4",
    on_counter_hit: "4",
    stance: "hush",
    from: "hush",
    edge_input: ":2",
  },
];
const csv = (rows: Cells[] = ROWS, header = HEADER) => [header, ...rows.map((r) => csvRow(r))].join("\n") + "\n";
const withRow = (i: number, change: Cells) => ROWS.map((r, k) => (k === i ? { ...r, ...change } : r));

describe("a good file", () => {
  test("the small character reads, with the edge into each move", () => {
    const r = parseCharactersCsv(csv());
    expect(r.ok && r.characters[0]!.edges.map((e) => `${e.kind} ${e.from}>${e.to}`)).toEqual([
      "follow 1>1,2",
      "cancel 1,2>hush",
      "enter hush>HSH:2",
    ]);
  });

  test("a UTF-8 byte order mark, CRLF line ends and quoted cells with commas, quotes and line breaks", () => {
    const rows = withRow(2, { notes: 'Fast, "safe"\r\nand\nplus' });
    const text = `\uFEFF${[HEADER, ...rows.map((r) => csvRow(r))].join("\r\n")}\r\n`;
    const r = parseCharacterFile("pell.csv", bytes(text));
    expect(r.ok && r.characters[0]!.moves[0]!.notes).toBe('Fast, "safe"\r\nand\nplus');
  });

  test("a semicolon-separated file (a spreadsheet in a decimal-comma language) reads the same", () => {
    const text = Papa.unparse(Papa.parse<string[]>(csv(), { skipEmptyLines: true }).data, { delimiter: ";" });
    expect(csvDelimiter(text)).toBe(";");
    expect(parseCharactersCsv(text)).toEqual(parseCharactersCsv(csv()));
  });

  test("headers as a person types them: any case, spaces or dashes", () => {
    const header = CSV_COLUMNS.map((c) => c.replace(/_/g, " ").toUpperCase()).join(",");
    expect(parseCharactersCsv(csv(ROWS, header))).toEqual(parseCharactersCsv(csv()));
  });

  test("a move without a key takes its input as key, and other rows can name it by that", () => {
    const rows = [ROWS[0]!, { ...ROWS[2]!, key: "" }, { ...ROWS[3]!, key: "" }];
    const r = parseCharactersCsv(csv(rows));
    expect(r.ok && r.characters[0]!.moves.map((m) => m.key)).toEqual(["1", "1,2"]);
    expect(r.ok && r.characters[0]!.edges.map((e) => `${e.from}>${e.to}`)).toEqual(["1>1,2"]);
  });

  test("the row reader takes papaparse's stream row by row and counts them", () => {
    const reader = createCsvReader();
    const text = csv();
    Papa.parse<string[]>(text, { ...csvParseConfig(csvDelimiter(text)), step: (r) => reader.push(r) });
    expect(reader.rows).toBe(ROWS.length);
    expect(reader.finish()).toEqual(parseCharactersCsv(text));
  });
});

describe("a CSV with mistakes: every problem with its line and column", () => {
  test.each<[string, string, string[]]>([
    ["a missing header", [...ROWS.map((r) => csvRow(r))].join("\n"), ["line 1: the first line must name the columns"]],
    ["a missing column", csv(ROWS, HEADER.replace(",on_block", "")), ["line 1: missing column on_block"]],
    ["an unknown column", csv(ROWS, `${HEADER},speed`), ['line 1: unknown column "speed"']],
    ["a column twice", csv(ROWS, `${HEADER},name`), ['line 1: the column "name" appears twice']],
    [
      "a word for a number",
      csv(withRow(2, { damage: "ten" })),
      ['line 4, column damage: must be a whole number, not text "ten"'],
    ],
    [
      "a fraction of a frame",
      csv(withRow(2, { startup: "10.5" })),
      ["line 4, column startup: must be a whole number, not 10.5"],
    ],
    [
      "a number out of range",
      csv(withRow(2, { damage: "100000" })),
      ["line 4, column damage: must be at most 9999, not 100000"],
    ],
    ["a negative startup", csv(withRow(2, { startup: "-3" })), ["line 4, column startup: must be at least 1, not -3"]],
    [
      "an unknown level",
      csv(withRow(2, { level: "mids" })),
      ['line 4, column level: unknown level "mids"; use one of high, mid'],
    ],
    [
      "an unknown state",
      csv(withRow(3, { on_hit: "knockback" })),
      ["line 5, column on_hit: must be a whole number of frames, or a state (knockdown"],
    ],
    [
      "an unknown auto-guard level",
      csv(withRow(4, { auto_guard: "high; hgih" })),
      ['line 6, column auto_guard: unknown level "hgih"'],
    ],
    [
      "yes or no misspelt",
      csv(withRow(3, { combo_on_hit: "maybe" })),
      ["line 5, column combo_on_hit: must be true or false"],
    ],
    ["an empty required cell", csv(withRow(2, { name: "" })), ["line 4, column name: is empty or missing"]],
    [
      "an unknown kind of row (the move it names is then unknown too)",
      csv(withRow(2, { row: "mvoe" })),
      ['line 4, column row: "mvoe" is not a kind of row', 'line 5, column from: no move or stance has the key "1"'],
    ],
    [
      "a cell the row does not use",
      csv(withRow(4, { level: "mid" })),
      ["line 6, column level: level is not used on a cancel row"],
    ],
    [
      "a follow from a move that does not exist",
      csv(withRow(3, { from: "9" })),
      ['line 5, column from: no move or stance has the key "9"'],
    ],
    [
      "a cancel into a stance that does not exist",
      csv(withRow(4, { stance: "hsuh" })),
      ['line 6, column stance: no stance has the key "hsuh"'],
    ],
    [
      "a cancel into a move",
      csv(withRow(4, { stance: "1" })),
      ['line 6, column stance: "1" is a move, but a cancel goes from a move into a stance'],
    ],
    [
      "a move done from an unknown stance",
      csv(withRow(5, { stance: "hus" })),
      ['line 7, column stance: no stance has the key "hus"'],
    ],
    [
      "a gap on a move entered from a stance",
      csv(withRow(5, { gap_on_block: "2" })),
      ["line 7, column gap_on_block: gap_on_block is for a move that follows a hit"],
    ],
    [
      "a duplicate move key",
      csv(withRow(5, { key: "1,2", from: "", edge_input: "", stance: "" })),
      ['line 7, column key: move key "1,2" is used twice (first at line 5)'],
    ],
    [
      "a duplicate stance key",
      csv([...ROWS, { row: "stance", key: "hush", name: "Hush 2", abbreviation: "H2" }]),
      ['line 8, column key: stance key "hush" is used twice (first at line 3)'],
    ],
    [
      "a move key that is also a stance key",
      csv([...ROWS, { ...ROWS[2]!, key: "hush" }]),
      ['line 8, column key: "hush" is already a stance\'s key'],
    ],
    [
      "the same cancel twice",
      csv([...ROWS, ROWS[4]!]),
      ['line 8: the cancel "1,2~b>hush" is listed twice (first at line 6)'],
    ],
    ["no character row", csv(ROWS.slice(1)), ["line 2: the file has no character row"]],
    [
      "two character rows",
      csv([...ROWS, ROWS[0]!]),
      ["line 8: a second character row; to put several characters in one file, add a character column"],
    ],
    [
      "a bad slug",
      csv(withRow(0, { key: "Pell Two" })),
      ["line 2, column key: a slug is lowercase letters and digits"],
    ],
    [
      "a cell past the last column",
      `${csv().trimEnd()},extra\n`,
      ["line 7: this row has more cells than the header has columns"],
    ],
    [
      "a quote that is never closed",
      `${csv()}move,"2,2,Open\n`,
      ['line 8: a quoted cell starts on this line but its closing quote (") is missing'],
    ],
    [
      "an edge key longer than the database keeps",
      csv([...ROWS, { ...ROWS[2]!, key: "k".repeat(60) }, { ...ROWS[3]!, key: "m".repeat(60), from: "k".repeat(60) }]),
      ["line 9: this follow's key"],
    ],
  ])("%s", (_, text, expected) => {
    const found = texts(parseCharactersCsv(text));
    for (const e of expected)
      expect(
        found.some((f) => f.startsWith(e)),
        `${e}\nin\n${found.join("\n")}`,
      ).toBe(true);
    expect(found).toHaveLength(expected.length);
  });

  test("follows in a loop that passes through no stance are refused, naming the loop", () => {
    const loop = csv([
      ...ROWS,
      {
        row: "follow",
        key: "1",
        from: "1,2",
        edge_input: ",1",
        gap_on_block: "3",
        combo_on_hit: "no",
        combo_on_counter_hit: "no",
      },
    ]);
    expect(texts(parseCharactersCsv(loop))).toEqual([
      "line 8: these hits follow each other in a loop: 1 → 1,2 → 1; a string can only come back to a hit through a stance",
    ]);
  });

  test("a loop through a stance is allowed (cancel into the stance, enter, cancel again)", () => {
    const rows = [
      ...ROWS,
      {
        row: "cancel",
        from: "HSH:2",
        edge_input: "~b",
        stance: "hush",
        on_block: "1",
        on_hit: "6",
        on_counter_hit: "6",
      },
    ];
    expect(parseCharactersCsv(csv(rows)).ok).toBe(true);
  });

  test("line numbers count the lines inside quoted cells and blank lines", () => {
    const rows = withRow(2, { notes: "first\nsecond\r\nthird" });
    const text = [HEADER, ...rows.slice(0, 3).map((r) => csvRow(r)), "", csvRow({ ...rows[3]!, damage: "x" })].join(
      "\n",
    );
    // Header 1, character 2, stance 3, move 4-6 (three lines), blank 7, the bad row 8.
    expect(texts(parseCharactersCsv(text))).toEqual(['line 8, column damage: must be a whole number, not text "x"']);
  });

  test("the problems of a large file are capped, with a count of the rest", () => {
    const many = Array.from({ length: 400 }, (_, i) => ({ ...ROWS[2]!, key: `k${i}`, damage: "x" }));
    const found = texts(parseCharactersCsv(csv([...ROWS, ...many])));
    expect(found).toHaveLength(201);
    expect(found[200]).toMatch(/and 200 more problems/);
  });
});

describe("files that are not what they say", () => {
  test.each<[string, string, Uint8Array]>([
    ["an empty file", "the file is empty", new Uint8Array()],
    ["a file of blank lines", "the file is empty", bytes("\n\r\n  \n")],
    ["a byte order mark alone", "the file is empty", bytes("\uFEFF")],
    [
      "a binary file named .csv",
      "this is not a text file",
      Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48]),
    ],
    ["UTF-16 with a byte order mark", "saved as UTF-16", Uint8Array.from([0xff, 0xfe, ...utf16le(csv())])],
    ["UTF-16 without one", "saved as UTF-16", Uint8Array.from(utf16le(csv()))],
    ["an older encoding (Latin-1)", "not UTF-8 text", Uint8Array.from([...bytes("row,name\nmove,Caf"), 0xe9, 0x0a])],
  ])("%s: %s", (_, message, file) => {
    expect(texts(parseCharacterFile("pell.csv", file))).toEqual([expect.stringContaining(message)]);
  });

  test("the start of a file, as a browser reads it before streaming, is judged the same", () => {
    const start = (b: Uint8Array) => encodingProblem(b.slice(0, 4096), true)?.message ?? null;
    expect(start(Uint8Array.from([0xff, 0xfe, ...utf16le(csv().repeat(50))]))).toMatch(/UTF-16/);
    expect(start(Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0, 0, 0, 13]))).toMatch(/not a text file/);
    // A character cut by the 4 KB boundary is not an error in a file's start; in a whole file it is.
    const cut = bytes(`${"a".repeat(4095)}é`).slice(0, 4096);
    expect(start(cut)).toBeNull();
    expect(encodingProblem(cut)?.message).toMatch(/not UTF-8/);
  });

  test("a file over the limit is refused by its size, before it is read", async () => {
    const file = {
      name: "huge.csv",
      size: MAX_FILE_BYTES + 1,
      arrayBuffer: () => Promise.reject(new Error("read a file that is too big")),
    };
    expect(texts(await readCharacterFile(file))).toEqual([expect.stringContaining("the limit is 10.0 MB")]);
    expect(texts(parseCharacterFile("huge.csv", new Uint8Array(MAX_FILE_BYTES + 1)))).toEqual([
      expect.stringContaining("the limit is 10.0 MB"),
    ]);
  });

  test("a file at the limit is read", async () => {
    const text = csv();
    const padded = text + " ".repeat(MAX_FILE_BYTES - bytes(text).length);
    const file = new Blob([padded]);
    expect(
      (await readCharacterFile({ name: "pell.csv", size: file.size, arrayBuffer: () => file.arrayBuffer() })).ok,
    ).toBe(true);
  });
});

function utf16le(s: string): number[] {
  const out: number[] = [];
  for (let i = 0; i < s.length; i++) out.push(s.charCodeAt(i) & 0xff, s.charCodeAt(i) >> 8);
  return out;
}

describe("a JSON file with mistakes: every problem with its path", () => {
  const example = () => JSON.parse(exampleJson()) as Record<string, unknown> & { moves: Record<string, unknown>[] };
  const problems = (data: unknown) =>
    texts(parseCharactersJson(typeof data === "string" ? data : JSON.stringify(data)));

  test.each<[string, unknown, string[]]>([
    ["not JSON", "{ format: framefork", ["the file is not valid JSON"]],
    ["a list instead of a file", [], ['format: this is not a Framefork file: "format" must be']],
    ["another program's JSON", { name: "x" }, ["format: this is not a Framefork file"]],
    [
      "a later version",
      { ...example(), version: 2 },
      ["version: this file is format version 2; this Framefork reads version 1"],
    ],
    ["moves that are not a list", { ...example(), moves: {} }, ["moves: must be a list, not an object"]],
    ["a missing part", { ...example(), edges: undefined }, ["edges: is empty or missing"]],
    ["an unknown top-level field", { ...example(), extra: 1 }, ['(top level): unknown field "extra"']],
    [
      "an outcome of the wrong shape",
      (() => {
        const e = example();
        e.moves[3]!.onBlock = "knock";
        return e;
      })(),
      ["moves[3].onBlock: must be a whole number of frames, or a state"],
    ],
    [
      "an unknown state",
      (() => {
        const e = example();
        e.moves[3]!.onHit = { state: "stagger" };
        return e;
      })(),
      ['moves[3].onHit: unknown state "stagger"'],
    ],
    [
      "a misspelt field",
      (() => {
        const e = example();
        e.moves[0]!.onblock = 1;
        return e;
      })(),
      ['moves[0]: unknown field "onblock"'],
    ],
    [
      "an edge of an unknown kind",
      (() => {
        const e = example();
        (e.edges as Record<string, unknown>[])[0]!.kind = "link";
        return e;
      })(),
      ['edges[0].kind: unknown edge kind "link"; use follow, cancel or enter'],
    ],
    [
      "an edge to a move that does not exist",
      (() => {
        const e = example();
        (e.edges as Record<string, unknown>[])[0]!.to = "9,9";
        return e;
      })(),
      ['edges[0].to: no move has the key "9,9"'],
    ],
  ])("%s", (_, data, expected) => {
    const found = problems(data);
    for (const e of expected)
      expect(
        found.some((f) => f.startsWith(e)),
        `${e}\nin\n${found.join("\n")}`,
      ).toBe(true);
    expect(found).toHaveLength(expected.length);
  });

  test("JSON nested thousands of levels deep is refused with a message, not a crash", () => {
    for (const depth of [50, 10_000, 1_000_000]) {
      const deep = `${"[".repeat(depth)}${"]".repeat(depth)}`;
      expect(problems(deep)).toEqual([expect.stringContaining("nests deeper than 16 levels")]);
      const inMoves = exampleJson().replace('"moves": [', `"moves": [${'{"a":'.repeat(depth)}1${"}".repeat(depth)},`);
      expect(problems(inMoves)).toEqual([expect.stringContaining("nests deeper than 16 levels")]);
    }
  });

  test("brackets inside strings do not count as nesting", () => {
    const e = example();
    e.moves[0]!.notes = '[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[ {{{{{{{{{{{{{{{{{{{{ " [[[[[[[[[[[[';
    expect(parseCharactersJson(JSON.stringify(e)).ok).toBe(true);
  });

  test("a loop of follows in JSON names the path of the edge that closes it", () => {
    const e = example();
    (e.edges as unknown[]).push({
      kind: "follow",
      from: "n.v.t",
      to: "n",
      input: ".n",
      gapOnBlock: 2,
      comboOnHit: false,
      comboOnCounterHit: false,
    });
    expect(problems(e)).toEqual([
      `edges[${(e.edges as unknown[]).length - 1}]: these hits follow each other in a loop: n → n.v → n.v.t → n; a string can only come back to a hit through a stance`,
    ]);
  });

  test("an Edition file with the same character twice", () => {
    const { format: _f, version: _v, ...body } = example();
    const edition = { format: "framefork-edition", version: 1, characters: [body, body] };
    expect(problems(edition)).toEqual([
      'characters[1].character.slug: the character "merrith" appears twice in this file',
    ]);
  });
});
