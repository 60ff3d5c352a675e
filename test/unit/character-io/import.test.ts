import { and, asc, eq, sql } from "drizzle-orm";
import { afterAll, describe, expect, test } from "vitest";
import type { PortableCharacter, PortableMove } from "@/lib/character-file";
import { closeDb, getDb } from "@/server/db";
import { loadPortableCharacter } from "@/server/db/queries/character-io";
import { getCharacterGraph } from "@/server/db/queries/moves";
import { moves } from "@/server/db/schema";
import { importInto, move, rowCounts, teamWithDraft } from "./fixtures";

// importCharacter against the test MariaDB: rows are matched by key, so an unchanged row keeps
// its id and version, a changed one keeps its id and gets version + 1, and a new place in the
// list changes the order without a new version.

afterAll(closeDb);

const base = (ms: PortableMove[]): PortableCharacter => ({
  character: { slug: "arrowquint", name: "Player Arrowquint", summary: "Keeps out." },
  stances: [],
  moves: ms,
  edges: [],
});

async function rows(scope: { editionId: number; characterId: number }) {
  return getDb()
    .select({ key: moves.key, id: moves.id, version: moves.version, sort: moves.sort })
    .from(moves)
    .where(and(eq(moves.editionId, scope.editionId), eq(moves.characterId, scope.characterId)))
    .orderBy(asc(moves.sort), asc(moves.id));
}

describe("importCharacter", () => {
  test("keeps ids, bumps the version of changed rows only, and writes a new order without a new version", async () => {
    const t = await teamWithDraft(base([]).character);
    const scope = { editionId: t.edition.id, characterId: t.characterId };
    const run = (c: PortableCharacter, apply = true) => importInto(t, c, apply);

    await run(base([move("1"), move("2"), move("3")]));
    const first = await rows(scope);
    expect(first.map((r) => [r.key, r.version])).toEqual([
      ["1", 1],
      ["2", 1],
      ["3", 1],
    ]);

    // 2 changes its damage, 3 moves to the top, 1 stays as it was.
    const next = base([move("3"), move("1"), move("2", { damage: 15 })]);
    const preview = await run(next, false);
    expect(preview.ok && preview.preview.moves.changed).toEqual([
      { key: "2", changes: [{ field: "damage", before: 12, after: 15 }] },
    ]);
    expect(await rows(scope)).toEqual(first);
    await run(next);
    const after = await rows(scope);
    const id = (key: string, list: typeof first) => list.find((r) => r.key === key)!;
    expect(after.map((r) => r.key)).toEqual(["3", "1", "2"]);
    for (const key of ["1", "2", "3"]) expect(id(key, after).id).toBe(id(key, first).id);
    expect(after.map((r) => [r.key, r.version])).toEqual([
      ["3", 1],
      ["1", 1],
      ["2", 2],
    ]);
    expect(await loadPortableCharacter(scope)).toEqual(next);
  });

  test("the name and summary of the character stay the game's: the preview says the file's differ", async () => {
    const t = await teamWithDraft(base([]).character);
    const scope = { editionId: t.edition.id, characterId: t.characterId };
    const file = { ...base([move("1")]), character: { slug: "arrowquint", name: "Player A.", summary: null } };
    const r = await importInto(t, file);
    expect(r.ok && r.preview.kept).toEqual([
      { field: "name", before: "Player Arrowquint", after: "Player A." },
      { field: "summary", before: "Keeps out.", after: null },
    ]);
    expect((await loadPortableCharacter(scope))?.character).toEqual(base([]).character);
  });

  test("the Explorer's graph of an imported character has the file's nodes and edges", async () => {
    const t = await teamWithDraft(base([]).character);
    const scope = { editionId: t.edition.id, characterId: t.characterId };
    const file: PortableCharacter = {
      ...base([move("1"), move("1,1", { startup: null })]),
      edges: [
        { kind: "follow", from: "1", to: "1,1", input: ",1", gapOnBlock: 3, comboOnHit: true, comboOnCounterHit: true },
      ],
    };
    await importInto(t, file);
    const { graph, roots } = await getCharacterGraph(scope);
    expect(roots).toEqual(["1"]);
    expect(graph.edges).toEqual([{ ...file.edges[0], id: "1>1,1" }]);
    expect(graph.nodes.map((n) => n.id)).toEqual(["1", "1,1"]);
  });
});

describe("all or nothing", () => {
  test("a write the database refuses halfway (an edge, after the moves went in) leaves the draft as it was", async () => {
    const t = await teamWithDraft(base([]).character);
    const scope = { editionId: t.edition.id, characterId: t.characterId, teamId: t.team.id };
    await importInto(t, base([move("1")]));
    const before = await rowCounts(scope);
    // A trigger of this test's own refuses one edge key no other test writes.
    const probe = `probe-${t.characterId}`;
    await getDb().execute(
      sql.raw(`create trigger \`edges_refuse_${t.characterId}\` before insert on edges for each row
        if NEW.\`key\` = '1>${probe}' then signal sqlstate '45000' set message_text = 'refused by the test'; end if`),
    );
    try {
      const file: PortableCharacter = {
        ...base([move("1", { damage: 30 }), move("2"), move(probe, { startup: null })]),
        edges: [
          {
            kind: "follow",
            from: "1",
            to: probe,
            input: ",9",
            gapOnBlock: 1,
            comboOnHit: false,
            comboOnCounterHit: false,
          },
        ],
      };
      const failure = await importInto(t, file).then(
        () => null,
        (error: unknown) => error as { cause?: { message?: string } },
      );
      expect(failure?.cause?.message).toMatch(/refused by the test/);
    } finally {
      await getDb().execute(sql.raw(`drop trigger \`edges_refuse_${t.characterId}\``));
    }
    expect(await rowCounts(scope)).toEqual(before);
    expect(await loadPortableCharacter(scope)).toEqual(base([move("1")]));
  });
});
