import { readFileSync } from "node:fs";
import { join } from "node:path";
import Papa from "papaparse";
import { afterEach, describe, expect, test, vi } from "vitest";
import { MAX_FILE_BYTES, parseCharacterFile, parseCharactersCsv } from "../../../src/lib/character-file";
import {
  checkCharacterFile,
  connectionLabel,
  countsSentence,
  csvLineEnding,
  importUrl,
  sendCharacterFile,
  showValue,
  streamCsv,
} from "../../../src/lib/character-import";

// The browser's check of a character file before it is sent. papaparse streams a File only in a
// browser (it needs FileReader), so here it streams the same text in small chunks, which runs the
// same step-by-step path; the browser tests (test/e2e/import.spec.ts) stream a real File.

const examples = join(__dirname, "../../../public/examples");
const merrithCsv = readFileSync(join(examples, "merrith.csv"), "utf8");
const merrithJson = readFileSync(join(examples, "merrith.json"), "utf8");

/** A line's number as a text editor counts it (1-based, every line break counted): common practice, no source. */
const lineOf = (text: string, needle: string) => text.slice(0, text.indexOf(needle)).split(/\r\n|\r|\n/).length;

type Streamer = NonNullable<NonNullable<Parameters<typeof checkCharacterFile>[1]>["streamer"]>;
/** What the browser does with a File, papaparse reading its text (in chunks of `chunkSize`) instead of the File itself. */
const textStreamer =
  (chunkSize = 97): Streamer =>
  async (file, options) =>
    streamCsv(await file.text(), { ...options, chunkSize });

describe("streamCsv", () => {
  test("streamed in small chunks, a file reads exactly as the server reads it whole, and the progress climbs to 1", async () => {
    const seen: number[] = [];
    const streamed = await streamCsv(merrithCsv, {
      delimiter: ",",
      newline: csvLineEnding(merrithCsv),
      size: merrithCsv.length,
      chunkSize: 64,
      onProgress: (f) => seen.push(f),
    });
    expect(streamed.ok).toBe(true);
    expect(streamed).toEqual(parseCharactersCsv(merrithCsv));
    expect(seen.length).toBeGreaterThan(5);
    expect(seen.at(-1)).toBe(1);
    expect(seen.every((f, i) => f >= 0 && f <= 1 && (i === 0 || f >= seen[i - 1]!))).toBe(true);
  });

  test("a bad row is named by its line, counted across quoted cells that hold line breaks and across chunks", async () => {
    const withNotes = merrithCsv
      .replace(
        "Spark Jab,high,7,10,1,8,8,close,poke,standing,,,,,,,,,",
        'Spark Jab,high,7,10,1,8,8,close,poke,standing,,,,,,,,,"A note\nover three\nlines"',
      )
      .replace("Hook Lamp,high,", "Hook Lamp,overhead,");
    const line = lineOf(withNotes, "Hook Lamp,overhead");
    const r = await streamCsv(withNotes, {
      delimiter: ",",
      newline: csvLineEnding(withNotes),
      size: withNotes.length,
      chunkSize: 50,
    });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.problems).toEqual([expect.objectContaining({ line, column: "level" })]);
    expect(r.problems[0]!.message).toMatch(/unknown level "overhead"/);
  });
});

describe("checkCharacterFile", () => {
  test("a file over the limit is refused from its size alone, before a byte is read", async () => {
    const untouchable = {
      name: "huge.csv",
      size: MAX_FILE_BYTES + 1,
      slice: () => {
        throw new Error("read");
      },
      arrayBuffer: () => {
        throw new Error("read");
      },
      text: () => {
        throw new Error("read");
      },
    } as unknown as File;
    const streamer = vi.fn();
    const r = await checkCharacterFile(untouchable, { streamer });
    expect(r).toEqual({ ok: false, problems: [{ message: expect.stringMatching(/the limit is 10\.0 MB/) }] });
    expect(streamer).not.toHaveBeenCalled();
  });

  test("a file of exactly the limit is read", async () => {
    const rest = MAX_FILE_BYTES - Buffer.byteLength(merrithCsv);
    const padded = merrithCsv + "\r\n".repeat(Math.floor(rest / 2)) + " ".repeat(rest % 2);
    const file = new File([padded], "merrith.csv");
    expect(file.size).toBe(MAX_FILE_BYTES);
    expect((await checkCharacterFile(file, { streamer: textStreamer(1024 * 1024) })).ok).toBe(true);
  });

  const server = parseCharacterFile("merrith.csv", Buffer.from(merrithCsv));
  const rows = Papa.parse<string[]>(merrithCsv.trimEnd(), { header: false }).data;

  test.each([
    ["CRLF, as the example and our exports have it", "\r\n"],
    ["LF", "\n"],
    ["CR alone", "\r"],
  ])(
    "streamed in chunks shorter than the header, a file with %s line ends reads as the server reads it",
    async (_, newline) => {
      const text = Papa.unparse(rows, { newline });
      expect(Papa.parse(text.slice(0, 97)).data).toHaveLength(1); // the first chunk ends inside the header
      expect(await checkCharacterFile(new File([text], "merrith.csv"), { streamer: textStreamer() })).toEqual(server);
    },
  );

  test("CSV with semicolons (a spreadsheet in a decimal-comma language) reads like the comma file", async () => {
    const semicolons = Papa.unparse(rows, { delimiter: ";", newline: "\r\n" });
    expect(semicolons.split("\r\n")[0]).toContain("row;key;input");
    const r = await checkCharacterFile(new File([semicolons], "merrith.csv"), { streamer: textStreamer() });
    expect(r).toEqual(server);
  });

  test("a CSV saved as UTF-16 is refused with what to do, without streaming it", async () => {
    const utf16 = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(merrithCsv, "utf16le")]);
    const streamer = vi.fn();
    const r = await checkCharacterFile(new File([utf16], "merrith.csv"), { streamer });
    expect(r).toEqual({ ok: false, problems: [{ message: expect.stringMatching(/UTF-16; save it again as UTF-8/) }] });
    expect(streamer).not.toHaveBeenCalled();
  });

  test("a JSON file is read and checked whole, and holds the same character as the CSV", async () => {
    const streamer = vi.fn();
    const progress = vi.fn();
    const r = await checkCharacterFile(new File([merrithJson], "merrith.json"), { streamer, onProgress: progress });
    expect(r).toEqual(parseCharactersCsv(merrithCsv));
    expect(streamer).not.toHaveBeenCalled();
    expect(progress).toHaveBeenLastCalledWith(1);
  });

  test("a broken JSON file says where", async () => {
    const broken = merrithJson.replace('"level": "high"', '"level": "overhead"');
    expect(broken).not.toBe(merrithJson);
    const r = await checkCharacterFile(new File([broken], "merrith.json"));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems[0]).toMatchObject({ path: expect.stringMatching(/^moves\[\d+\]\.level$/) });
  });
});

describe("sending the file", () => {
  afterEach(() => vi.unstubAllGlobals());

  test("the address names the draft and the character, escaped, and asks for a preview only when told", () => {
    expect(importUrl("tide wire", "1-0", "corin/ash", true)).toBe(
      "/api/games/tide%20wire/editions/1-0/characters/corin%2Fash/import?preview=1",
    );
    expect(importUrl("g", "e", "c", false)).toBe("/api/games/g/editions/e/characters/c/import");
  });

  test("the file itself goes as the form field file, and a refusal comes back with every problem", async () => {
    const problems = [{ line: 7, column: "level", message: 'unknown level "overhead"' }];
    const fetch = vi.fn(async (_url: string, _init: RequestInit) =>
      Response.json(
        {
          error: { code: "bad_request", message: "The file has 1 problem; nothing was imported." },
          preview: null,
          problems,
        },
        { status: 400 },
      ),
    );
    vi.stubGlobal("fetch", fetch);
    const file = new File([merrithCsv], "merrith.csv");
    const out = await sendCharacterFile("/api/x/import?preview=1", file);
    expect(out).toEqual({
      ok: false,
      status: 400,
      message: "The file has 1 problem; nothing was imported.",
      problems,
    });
    const [url, init] = fetch.mock.calls[0]!;
    expect(url).toBe("/api/x/import?preview=1");
    expect(init.method).toBe("POST");
    const sent = (init.body as FormData).get("file") as File;
    expect(sent.name).toBe("merrith.csv");
    expect(await sent.text()).toBe(merrithCsv);
  });

  test("a refusal without problems (published, too large, not allowed) keeps the server's words", async () => {
    vi.stubGlobal(
      "fetch",
      vi.fn(async () =>
        Response.json({ error: { code: "conflict", message: "This Edition is published." } }, { status: 409 }),
      ),
    );
    expect(await sendCharacterFile("/x", new File(["a"], "a.csv"))).toEqual({
      ok: false,
      status: 409,
      message: "This Edition is published.",
      problems: [],
    });
  });

  test("no connection says so and that nothing was imported", async () => {
    vi.stubGlobal(
      "fetch",
      vi.fn(async () => {
        throw new TypeError("Failed to fetch");
      }),
    );
    const out = await sendCharacterFile("/x", new File(["a"], "a.csv"));
    expect(out).toMatchObject({ ok: false, status: 0, message: expect.stringMatching(/nothing was imported/) });
  });
});

describe("words of the preview", () => {
  const none = { added: 0, changed: 0, removed: 0 };
  test("counts become one sentence, parts joined, empty verbs left out", () => {
    expect(
      countsSentence({
        moves: { added: 3, changed: 1, removed: 0 },
        stances: { added: 1, changed: 0, removed: 0 },
        edges: { added: 2, changed: 0, removed: 1 },
      }),
    ).toBe("3 moves, 1 stance and 2 connections added; 1 move changed; 1 connection removed.");
    expect(countsSentence({ moves: none, stances: none, edges: none })).toMatch(/^Nothing to change/);
  });

  test("values read as a coach writes them in the CSV", () => {
    expect(showValue(-3)).toBe("-3");
    expect(showValue({ state: "knockdown", frames: 3 })).toBe("knockdown 3");
    expect(showValue({ state: "launch" })).toBe("launch");
    expect(showValue(["high", "mid"])).toBe("high; mid");
    expect(showValue(null)).toBe("(empty)");
    expect(showValue(true)).toBe("yes");
    expect(connectionLabel("1,2~b>lantern")).toBe("1,2~b → lantern");
    expect(connectionLabel("1>1,2")).toBe("1 → 1,2");
  });
});
