import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import { POST as addMove } from "@/app/api/games/[game]/editions/[edition]/characters/[character]/moves/route";
import { PATCH as saveMove } from "@/app/api/games/[game]/editions/[edition]/characters/[character]/moves/[move]/route";
import { POST as importFile } from "@/app/api/games/[game]/editions/[edition]/characters/[character]/import/route";
import { newGameSchema } from "@/lib/authoring";
import {
  exportCharacterCsv,
  exportCharacterJson,
  parseCharactersCsv,
  type PortableCharacter,
} from "@/lib/character-file";
import { closeDb } from "@/server/db";
import { loadPortableCharacter } from "@/server/db/queries/character-io";
import { setSession } from "../authz/session-mock";
import { move, rowCounts, teamWithDraft, type Target } from "./fixtures";

// A game that measures range in numbers takes only numbers, at every way in: a file (the problem
// at its line and column, or its JSON path), a new move and a changed move. A game of labels takes
// any text, as before.

vi.mock("@/server/auth", () => import("../authz/session-mock"));
afterAll(closeDb);

const SLUG = "quill";
const character = (ranges: (string | null)[]): PortableCharacter => ({
  character: { slug: SLUG, name: "Quill", summary: null },
  stances: [],
  moves: ranges.map((range, i) => move(String(i + 1), { range })),
  edges: [],
});

let t: Target;
const params = () => ({ game: t.game.slug, edition: t.edition.slug, character: SLUG });
const scope = () => ({ editionId: t.edition.id, characterId: t.characterId, teamId: t.team.id });

async function signIn(settings: Parameters<typeof teamWithDraft>[1]) {
  t = await teamWithDraft(character([]).character, settings);
  setSession({ id: t.coach.id, email: `${t.coach.id}@example.test`, name: "Coach" });
}

function upload(name: string, content: string) {
  const form = new FormData();
  form.set("file", new File([content], name));
  return importFile(new Request("http://test/api/import", { method: "POST", body: form }), {
    params: Promise.resolve(params()),
  });
}

const json = (method: string, body: unknown) =>
  new Request("http://test/api", {
    method,
    headers: { "content-type": "application/json" },
    body: JSON.stringify(body),
  });

type Problems = { problems: { line?: number; column?: string; path?: string; message: string }[] };

describe("a game that measures range in metres", () => {
  beforeEach(() => signIn({ rangeKind: "number", rangeUnit: "m" }));

  test("a file with a label for a range is refused at its line and column, or its JSON path, and writes nothing", async () => {
    const before = await rowCounts(scope());
    const bad = character(["1.2", "close"]);

    const csv = await upload("quill.csv", exportCharacterCsv(bad));
    expect(csv.status).toBe(400);
    const csvProblems = ((await csv.json()) as Problems).problems;
    // Line 1 is the header, line 2 the character, then one line per move.
    expect(csvProblems).toEqual([
      { line: 4, column: "range", message: expect.stringContaining('range "close" is not a number of m') },
    ]);

    const file = await upload("quill.json", exportCharacterJson(bad));
    expect(file.status).toBe(400);
    expect(((await file.json()) as Problems).problems).toEqual([
      { path: "moves[1].range", message: expect.stringContaining("not a number of m") },
    ]);
    expect(await rowCounts(scope())).toEqual(before);

    const good = character(["1.2", "2.75"]);
    expect((await upload("quill.csv", exportCharacterCsv(good))).status).toBe(200);
    expect((await loadPortableCharacter(scope()))!.moves.map((m) => m.range)).toEqual(["1.2", "2.75"]);
  });

  test("a new move or a changed move with a label for a range is refused, at the range field", async () => {
    expect((await upload("quill.csv", exportCharacterCsv(character(["1.2"])))).status).toBe(200);
    const ctx = { params: Promise.resolve(params()) };

    const added = await addMove(json("POST", { move: { ...move("2"), range: "far" } }), ctx);
    expect(added.status).toBe(400);
    expect(((await added.json()) as { error: { message: string } }).error.message).toMatch(
      /"far" is not a number of m/,
    );

    const at = { params: Promise.resolve({ ...params(), move: "1" }) };
    const changed = await saveMove(json("PATCH", { version: 1, changes: { range: "sweep" } }), at);
    expect(changed.status).toBe(400);
    const refusal = (await changed.json()) as { error: { issues: { path: string[]; message: string }[] } };
    expect(refusal.error.issues).toEqual([{ path: ["range"], message: expect.stringContaining('"sweep"') }]);

    const fixed = await saveMove(json("PATCH", { version: 1, changes: { range: "1.45" } }), {
      params: Promise.resolve({ ...params(), move: "1" }),
    });
    expect(fixed.status).toBe(200);
    expect((await loadPortableCharacter(scope()))!.moves.map((m) => m.range)).toEqual(["1.45"]);
  });
});

describe("a game that measures range as labels", () => {
  beforeEach(() => signIn({}));

  test("takes any text for a range, as a file and as an edit", async () => {
    expect((await upload("quill.csv", exportCharacterCsv(character(["close", "1.2"])))).status).toBe(200);
    const at = { params: Promise.resolve({ ...params(), move: "1" }) };
    expect((await saveMove(json("PATCH", { version: 1, changes: { range: "sweep" } }), at)).status).toBe(200);
  });
});

describe("the game's settings", () => {
  test("numbers need a unit, said at the unit's field; with labels the unit is dropped", () => {
    const refused = newGameSchema.safeParse({ name: "Range Game", rangeKind: "number" });
    expect(refused.success).toBe(false);
    expect(refused.error?.issues.map((i) => i.path)).toEqual([["rangeUnit"]]);
    expect(newGameSchema.parse({ name: "Range Game", rangeKind: "label", rangeUnit: "m" }).rangeUnit).toBeNull();
    expect(newGameSchema.parse({ name: "Range Game", rangeKind: "number", rangeUnit: " m " }).rangeUnit).toBe("m");
  });

  test("a file read without the game's scale takes labels: the check is the game's, not the format's", () => {
    expect(parseCharactersCsv(exportCharacterCsv(character(["close"]))).ok).toBe(true);
    expect(
      parseCharactersCsv(exportCharacterCsv(character(["close"])), { range: { kind: "number", unit: "m" } }).ok,
    ).toBe(false);
  });
});
