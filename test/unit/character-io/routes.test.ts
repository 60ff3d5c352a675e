import { fc } from "@fast-check/vitest";
import Papa from "papaparse";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import {
  exportCharacterCsv,
  exportCharacterJson,
  MAX_FILE_BYTES,
  parseCharacterFile,
  type PortableCharacter,
} from "@/lib/character-file";
import { GET as exportCharacter } from "@/app/api/games/[game]/editions/[edition]/characters/[character]/export/route";
import { POST as importFile } from "@/app/api/games/[game]/editions/[edition]/characters/[character]/import/route";
import { GET as exportEdition } from "@/app/api/games/[game]/editions/[edition]/export/route";
import { closeDb } from "@/server/db";
import { listAudit } from "@/server/db/queries/audit";
import { publishEdition } from "@/server/db/queries/authoring";
import { loadPortableCharacter } from "@/server/db/queries/character-io";
import { setSession } from "../authz/session-mock";
import { move, rowCounts, teamWithDraft, type Target } from "./fixtures";

// The import and export routes against the test MariaDB: a bad file is answered with every
// problem (line numbers or JSON paths) and writes nothing; a preview writes nothing; a published
// Edition is refused; what a spreadsheet would run as a formula goes in and comes out as text.

vi.mock("@/server/auth", () => import("../authz/session-mock"));
afterAll(closeDb);

const SLUG = "vantorix";
const ONA: PortableCharacter = {
  character: { slug: SLUG, name: "Player Vantorix", summary: null },
  stances: [{ key: "low-guard", name: "Low Guard", abbreviation: "LG", notes: null }],
  moves: [move("1"), move("1,2", { startup: null }), move("LG:2", { stance: "low-guard" })],
  edges: [
    { kind: "follow", from: "1", to: "1,2", input: ",2", gapOnBlock: 2, comboOnHit: true, comboOnCounterHit: true },
    {
      kind: "cancel",
      from: "1,2",
      to: "low-guard",
      input: "~d",
      onBlock: -1,
      onHit: 4,
      onCounterHit: 4,
      autoGuard: ["high"],
    },
    { kind: "enter", from: "low-guard", to: "LG:2", input: ":2" },
  ],
};

let t: Target;
beforeEach(async () => {
  t = await teamWithDraft(ONA.character);
  setSession({ id: t.coach.id, email: `${t.coach.id}@example.test`, name: "Coach" });
});

const params = () => ({ game: t.game.slug, edition: t.edition.slug, character: SLUG });
const scope = () => ({ editionId: t.edition.id, characterId: t.characterId, teamId: t.team.id });

function upload(name: string, content: BlobPart, query = "") {
  const form = new FormData();
  form.set("file", new File([content], name));
  return importFile(new Request(`http://test/api/import${query}`, { method: "POST", body: form }), {
    params: Promise.resolve(params()),
  });
}

async function download(format: "csv" | "json") {
  const res = await exportCharacter(new Request(`http://test/api/export?format=${format}`), {
    params: Promise.resolve(params()),
  });
  return { res, text: await res.text() };
}

type Answer = {
  preview: { moves: { added: string[]; changed: { key: string; changes: { field: string }[] }[]; removed: string[] } };
  problems: { line?: number; path?: string; message: string }[];
  error?: { message: string };
};

describe("import", () => {
  test("a preview says what would change and writes nothing; the import then writes it and logs it", async () => {
    const before = await rowCounts(scope());
    const res = await upload("ona.csv", exportCharacterCsv(ONA), "?preview=1");
    expect(res.status).toBe(200);
    const body = (await res.json()) as Answer;
    expect(body.preview.moves.added).toEqual(["1", "1,2", "LG:2"]);
    expect(await rowCounts(scope())).toEqual(before);

    expect((await upload("ona.json", exportCharacterJson(ONA))).status).toBe(200);
    expect(await loadPortableCharacter(scope())).toEqual(ONA);
    expect((await listAudit({ teamId: t.team.id })).at(-1)).toMatchObject({
      action: "character.imported",
      detail: { character: SLUG, moves_added: 3, edges_added: 3, stances_added: 1 },
    });

    // A balance patch: one move changed, one removed, one added; the rest keep their ids.
    const patched: PortableCharacter = {
      ...ONA,
      moves: [move("1", { onBlock: -2 }), move("1,2", { startup: null }), move("2")],
      stances: ONA.stances,
      edges: ONA.edges.filter((e) => e.kind !== "enter"),
    };
    const preview = (await (await upload("ona.csv", exportCharacterCsv(patched), "?preview=1")).json()) as Answer;
    expect(preview.preview.moves).toEqual({
      added: ["2"],
      changed: [{ key: "1", changes: [{ field: "onBlock", before: -4, after: -2 }] }],
      removed: ["LG:2"],
    });
    expect((await upload("ona.csv", exportCharacterCsv(patched))).status).toBe(200);
    expect(await loadPortableCharacter(scope())).toEqual(patched);
  });

  test("a published Edition is refused with 409, and nothing is written", async () => {
    await publishEdition({ teamId: t.team.id, gameId: t.game.id, editionId: t.edition.id, actorId: t.coach.id });
    const before = await rowCounts(scope());
    for (const query of ["", "?preview=1"]) {
      const res = await upload("ona.csv", exportCharacterCsv(ONA), query);
      expect(res.status).toBe(409);
      expect(((await res.json()) as Answer).error?.message).toMatch(/published/);
    }
    expect(await rowCounts(scope())).toEqual(before);
  });

  const csv = exportCharacterCsv(ONA);
  const lines = csv.split("\r\n");
  const json = JSON.parse(exportCharacterJson(ONA)) as Record<string, unknown>;
  const utf16 = new Uint8Array([0xff, 0xfe, ...[...csv].flatMap((ch) => [ch.charCodeAt(0) & 0xff, 0])]);
  const BAD: [what: string, name: string, content: BlobPart, problem: RegExp, where?: "line" | "path"][] = [
    ["a wrong header", "ona.csv", ["kind,slug,title", ...lines.slice(1)].join("\r\n"), /first line must name/],
    [
      "an unknown column",
      "ona.csv",
      lines.map((l, i) => (i === 0 ? `${l},colour` : `${l},`)).join("\r\n"),
      /unknown column "colour"/,
      "line",
    ],
    [
      "a duplicate key",
      "ona.csv",
      [...lines.slice(0, -1), lines.find((l) => l.startsWith("move,1,"))!, ""].join("\r\n"),
      /used twice/,
      "line",
    ],
    [
      "an unknown reference",
      "ona.json",
      JSON.stringify({ ...json, edges: [{ kind: "enter", from: "no-such", to: "1", input: "2" }] }),
      /no stance has the key "no-such"/,
      "path",
    ],
    [
      "a loop of follows",
      "ona.json",
      JSON.stringify({
        ...json,
        edges: [
          ...(json.edges as unknown[]),
          {
            kind: "follow",
            from: "1,2",
            to: "1",
            input: ",1",
            gapOnBlock: 0,
            comboOnHit: false,
            comboOnCounterHit: false,
          },
        ],
      }),
      /loop/,
      "path",
    ],
    ["an empty file", "ona.csv", "", /empty/],
    ["a binary file", "ona.csv", new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0, 0, 1, 2]), /not a text file/],
    ["UTF-16", "ona.csv", utf16, /UTF-16/],
    [
      "the wrong JSON shape",
      "ona.json",
      JSON.stringify({ format: "framefork-character", version: 1, moves: {} }),
      /./,
      "path",
    ],
    ["deeply nested JSON", "ona.json", `${"[".repeat(5000)}${"]".repeat(5000)}`, /nests deeper/],
    [
      "another character's file",
      "ona.json",
      JSON.stringify({ ...json, character: { slug: "someone-else", name: "X" } }),
      /for the character "someone-else"/,
    ],
    [
      "keys the database takes for one",
      "ona.json",
      JSON.stringify({
        ...json,
        moves: [...(json.moves as object[]), { ...(json.moves as object[])[0], key: "lg:2", input: "x" }],
      }),
      /differ only in case/,
    ],
  ];
  test.each(BAD)("%s: 400 with its problem, and nothing written", async (_what, name, content, problem, where) => {
    const before = await rowCounts(scope());
    for (const query of ["?preview=1", ""]) {
      const res = await upload(name, content, query);
      const body = (await res.json()) as Answer;
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(body.problems.map((p) => p.message).join("\n")).toMatch(problem);
      if (where)
        expect(
          body.problems.every((p) => p[where] !== undefined),
          JSON.stringify(body.problems),
        ).toBe(true);
      expect(body.error?.message).toMatch(/nothing was imported/);
    }
    expect(await rowCounts(scope())).toEqual(before);
  });

  test("a file over the limit is refused with 413 before it is parsed, and nothing is written", async () => {
    const before = await rowCounts(scope());
    const res = await upload("ona.csv", new Uint8Array(MAX_FILE_BYTES + 1).fill(0x41));
    expect(res.status).toBe(413);
    expect(((await res.json()) as Answer).error?.message).toMatch(/larger than 10 MB/);
    expect(await rowCounts(scope())).toEqual(before);
  });

  test("arbitrary files (broken lines of a real one, any text, any bytes) never answer 500, and a refusal writes nothing", async () => {
    const cut = fc
      .tuple(fc.nat({ max: lines.length }), fc.nat({ max: lines.length }), fc.string({ maxLength: 12 }))
      .map(([a, b, junk]) => [...lines.slice(0, a), junk, ...lines.slice(b)].join("\r\n"));
    const content = fc.oneof(
      cut,
      fc.string({ maxLength: 200 }),
      fc.string({ unit: "binary", maxLength: 200 }),
      fc.uint8Array({ maxLength: 200 }),
    );
    await fc.assert(
      fc.asyncProperty(
        content,
        fc.constantFrom("ona.csv", "ona.json", "ona", ""),
        fc.boolean(),
        async (c, name, preview) => {
          const before = await rowCounts(scope());
          const res = await upload(name, c, preview ? "?preview=1" : "");
          expect(res.status, await res.clone().text()).toBeLessThan(500);
          if (res.status >= 400 || preview) expect(await rowCounts(scope())).toEqual(before);
        },
      ),
      { numRuns: 60, seed: 20_261_202 },
    );
  });

  test("a body that is not a form upload is refused with 415", async () => {
    const res = await importFile(
      new Request("http://test/api/import", { method: "POST", body: csv, headers: { "content-type": "text/csv" } }),
      { params: Promise.resolve(params()) },
    );
    expect(res.status).toBe(415);
  });
});

describe("export", () => {
  test("names, notes and tags that start with = + - @ go in and come out unchanged, and never start a CSV cell", async () => {
    const risky: PortableCharacter = {
      ...ONA,
      moves: [
        move("1", { name: '=HYPERLINK("http://example.test")', notes: "+1 frame", tags: ["-cmd", "@sum"] }),
        move("1,2", { startup: null, name: "@Stomp", range: "-5" }),
        move("LG:2", { stance: "low-guard", name: "-Sweep" }),
      ],
    };
    expect((await upload("ona.json", exportCharacterJson(risky))).status).toBe(200);
    expect(await loadPortableCharacter(scope())).toEqual(risky);

    const { res, text } = await download("csv");
    expect(res.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(res.headers.get("content-disposition")).toBe(
      `attachment; filename="${t.game.slug}-${t.edition.slug}-${SLUG}.csv"`,
    );
    expect(res.headers.get("cache-control")).toBe("private, no-store");
    // OWASP, "CSV Injection": no cell may begin with = + - @ (a tab or a carriage return) unescaped.
    const cells = Papa.parse<string[]>(text, { skipEmptyLines: true }).data.flat();
    expect(cells.filter((c) => /^[=+@\t\r]/.test(c) || /^-[^0-9]/.test(c))).toEqual([]);
    // What comes out reads back as what went in.
    const again = parseCharacterFile("back.csv", new TextEncoder().encode(text));
    expect(again.ok && again.characters[0]).toEqual(risky);

    const json = await download("json");
    expect(json.res.headers.get("content-type")).toBe("application/json; charset=utf-8");
    expect((JSON.parse(json.text) as PortableCharacter).moves[0]!.name).toBe(risky.moves[0]!.name);
  });

  test("a whole Edition comes as one file with every character that has frame data in it", async () => {
    expect((await upload("ona.csv", exportCharacterCsv(ONA))).status).toBe(200);
    const res = await exportEdition(new Request("http://test/api/export?format=json"), {
      params: Promise.resolve({ game: t.game.slug, edition: t.edition.slug }),
    });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-disposition")).toBe(`attachment; filename="${t.game.slug}-${t.edition.slug}.json"`);
    const back = parseCharacterFile("edition.json", new TextEncoder().encode(await res.text()));
    expect(back.ok && back.characters).toEqual([ONA]);
  });

  test("an unknown format is refused with 400", async () => {
    const res = await exportCharacter(new Request("http://test/api/export?format=xlsx"), {
      params: Promise.resolve(params()),
    });
    expect(res.status).toBe(400);
  });
});
