import { fc, test } from "@fast-check/vitest";
import Papa from "papaparse";
import { describe, expect } from "vitest";
import {
  CSV_COLUMNS,
  exportCharacterCsv,
  exportCharacterJson,
  exportEditionCsv,
  exportEditionJson,
  parseCharacterFile,
  parseCharactersCsv,
  parseCharactersJson,
  protectCell,
  toMoveGraph,
  unprotectCell,
  type ParseResult,
  type PortableCharacter,
} from "../../../src/lib/character-file";
import { compileGraph, explorePathsLimited } from "../../../src/lib/engine";
import { graphSchema } from "../../../src/lib/engine/schema";
import { characterArb } from "./arbitraries";

const characters = (r: ParseResult): PortableCharacter[] => {
  if (!r.ok) throw new Error(r.problems.map((p) => JSON.stringify(p)).join("\n"));
  return r.characters;
};

const editionArb = fc
  .array(characterArb({ moves: 4, stances: 2 }), { minLength: 1, maxLength: 3 })
  .filter((cs) => new Set(cs.map((c) => c.character.slug)).size === cs.length);

/**
 * RFC 4180 section 2 (https://www.rfc-editor.org/rfc/rfc4180#section-2), read strictly as
 * its ABNF has it: records end in CRLF, a field is either escaped (in double quotes, with
 * quotes doubled, and may hold commas, CR and LF) or holds no comma, quote, CR or LF. One
 * deviation, as common practice has it: TEXTDATA here is any other character, not only
 * printable ASCII, since the file is UTF-8.
 */
function parseRfc4180(text: string): string[][] {
  const records: string[][] = [];
  let i = 0;
  let record: string[] = [];
  const fail = (why: string) => {
    throw new Error(`not RFC 4180 at offset ${i}: ${why}`);
  };
  for (;;) {
    let field = "";
    if (text[i] === '"') {
      i++;
      for (;;) {
        if (i >= text.length) fail("unterminated escaped field");
        if (text[i] === '"') {
          if (text[i + 1] === '"') {
            field += '"';
            i += 2;
          } else {
            i++;
            break;
          }
        } else field += text[i++];
      }
    } else {
      while (i < text.length && text[i] !== "," && text[i] !== "\r" && text[i] !== "\n") {
        if (text[i] === '"') fail("a quote inside a field that is not escaped");
        field += text[i++];
      }
    }
    record.push(field);
    if (text[i] === ",") {
      i++;
      continue;
    }
    if (text.startsWith("\r\n", i)) {
      i += 2;
      records.push(record);
      record = [];
      if (i === text.length) return records;
      continue;
    }
    if (i === text.length) {
      records.push(record);
      return records;
    }
    fail(`a line break that is not CRLF, or text after a closing quote (${JSON.stringify(text[i])})`);
  }
}

/** OWASP, "CSV Injection" (https://owasp.org/www-community/attacks/CSV_Injection, from memory): cells starting with these are read as formulas. */
const FORMULA_START = ["=", "+", "-", "@", "\t", "\r"];
const NUMBER_COLUMNS = new Set(["damage", "startup", "gap_on_block", "on_block", "on_hit", "on_counter_hit"]);

describe("export then import gives back the same data", () => {
  test.prop([characterArb()], { numRuns: 150 })("one character through JSON", (c) => {
    expect(characters(parseCharactersJson(exportCharacterJson(c)))).toEqual([c]);
  });

  test.prop([characterArb()], { numRuns: 150 })("one character through CSV", (c) => {
    expect(characters(parseCharactersCsv(exportCharacterCsv(c)))).toEqual([c]);
  });

  test.prop([editionArb], { numRuns: 50 })("a whole Edition through JSON and through CSV", (cs) => {
    expect(characters(parseCharactersJson(exportEditionJson(cs)))).toEqual(cs);
    expect(characters(parseCharactersCsv(exportEditionCsv(cs)))).toEqual(cs);
  });

  test.prop([characterArb()], { numRuns: 100 })(
    "a CSV saved again by a spreadsheet (LF line ends, every cell quoted, a UTF-8 BOM) reads the same",
    (c) => {
      const rows = Papa.parse<string[]>(exportCharacterCsv(c), { header: false, skipEmptyLines: true }).data;
      const resaved = `\uFEFF${Papa.unparse(rows, { quotes: true, newline: "\n" })}\n`;
      expect(characters(parseCharacterFile("sheet.csv", new TextEncoder().encode(resaved)))).toEqual([c]);
    },
  );

  test.prop([characterArb()], { numRuns: 100 })("what a file gives, the engine accepts and explores", (c) => {
    const graph = toMoveGraph(c);
    expect(graphSchema.safeParse(graph).success).toBe(true);
    const compiled = compileGraph(graph);
    for (const m of c.moves) {
      const { paths } = explorePathsLimited(compiled, m.key, 200, { maxDepth: 4 });
      expect(paths[0]?.nodes[0]).toBe(m.key);
    }
  });
});

describe("the CSV we write, read by outside rules", () => {
  test.prop([characterArb()], { numRuns: 100 })("is RFC 4180 and papaparse reads the same cells", (c) => {
    const csv = exportCharacterCsv(c);
    const rfc = parseRfc4180(csv);
    // RFC 4180 2.4: every record has the same number of fields as the header.
    for (const r of rfc) expect(r).toHaveLength(CSV_COLUMNS.length);
    const papa = Papa.parse<string[]>(csv, { header: false, skipEmptyLines: true });
    expect(papa.errors).toEqual([]);
    expect(papa.data).toEqual(rfc);
  });

  test.prop([characterArb()], { numRuns: 100 })(
    "no text cell starts with a formula character; number cells hold plain numbers",
    (c) => {
      const { data } = Papa.parse<Record<string, string>>(exportCharacterCsv(c), {
        header: true,
        skipEmptyLines: true,
      });
      for (const row of data) {
        for (const [column, cell] of Object.entries(row)) {
          if (NUMBER_COLUMNS.has(column) && /^-?\d+$/.test(cell)) continue;
          expect(
            FORMULA_START.some((ch) => cell.startsWith(ch)),
            `${column}: ${JSON.stringify(cell)}`,
          ).toBe(false);
        }
      }
    },
  );

  test.each([
    ["=SUM(A1:A9)", "'=SUM(A1:A9)"],
    ["+1 on block", "'+1 on block"],
    ["-2 when cancelled", "'-2 when cancelled"],
    ["@home", "'@home"],
    ["\tindented", "'\tindented"],
    ["\rreturn", "'\rreturn"],
    ["'quoted", "''quoted"],
    ["plain", "plain"],
  ])("%j is written as %j and read back unchanged", (value, written) => {
    expect(protectCell(value)).toBe(written);
    expect(unprotectCell(protectCell(value))).toBe(value);
  });

  test("names beginning with = + - @ and ' survive CSV and JSON", () => {
    const base: PortableCharacter = {
      character: { slug: "trial", name: '=HYPERLINK("x")', summary: "-note" },
      stances: [{ key: "@s", name: "+Stance", abbreviation: "'AB", notes: "\tnote" }],
      moves: [
        {
          key: "=1",
          input: "-1",
          name: "@Move",
          level: "mid",
          damage: 10,
          startup: 12,
          onBlock: -3,
          onHit: 4,
          onCounterHit: { state: "knockdown", frames: -2 },
          range: "+far",
          tags: ["=tag", "'tag"],
          notes: "''twice",
          fromPosture: "any",
          stance: "@s",
        },
      ],
      edges: [{ kind: "enter", from: "@s", to: "=1", input: "+2" }],
    };
    const csv = exportCharacterCsv(base);
    expect(csv).toContain("'=HYPERLINK");
    expect(characters(parseCharactersCsv(csv))).toEqual([base]);
    expect(characters(parseCharactersJson(exportCharacterJson(base)))).toEqual([base]);
  });
});
