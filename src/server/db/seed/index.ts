import { and, eq, getTableColumns, notInArray, sql, type SQL } from "drizzle-orm";
import type { MySqlTable } from "drizzle-orm/mysql-core";
import type { Database } from "../index";
import { characters, editions, edges, games, moves, stances, type NewEdge, type NewMove } from "../schema";
import { DEMO_CHARACTERS, DEMO_GAME, EDITIONS, type DemoCharacter, type EditionSlug } from "./demo";
import { flatten, postureOf, type CharacterData } from "./dsl";

type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];

/** `ON DUPLICATE KEY UPDATE col = VALUES(col)` for every column but the listed keys. */
function updateAllBut<T extends MySqlTable>(table: T, keep: string[]): Record<string, SQL> {
  const set: Record<string, SQL> = {};
  for (const [prop, column] of Object.entries(getTableColumns(table))) {
    if (keep.includes(prop)) continue;
    set[prop] = sql.raw(`values(\`${column.name}\`)`);
  }
  return set;
}

export interface SeedReport {
  game: number;
  editions: number;
  /** Editions written and published by this run; the others were published before and stay as they are. */
  published: number;
  characters: number;
  stances: number;
  moves: number;
  edges: number;
}

/**
 * Writes the demo scenario. Idempotent: the game and its characters are upserted on their slugs;
 * each Edition is written as a draft and then published, and a published Edition is frozen (the
 * database refuses writes to it), so a second run leaves it, and every id, as it is.
 * `extraCharacters` are written into each Edition beside the demo cast before it is published
 * (the UI bench adds a generated character this way).
 */
export async function seedDemo(
  db: Database,
  { extraCharacters = [] }: { extraCharacters?: DemoCharacter[] } = {},
): Promise<SeedReport> {
  return db.transaction(async (tx) => {
    await tx
      .insert(games)
      .values(DEMO_GAME)
      .onDuplicateKeyUpdate({ set: updateAllBut(games, ["id", "slug", "createdAt"]) });
    const [game] = await tx.select({ id: games.id }).from(games).where(eq(games.slug, DEMO_GAME.slug));
    if (!game) throw new Error("demo game was not written");

    const cast = [...DEMO_CHARACTERS, ...extraCharacters];
    await tx
      .insert(characters)
      .values(cast.map((c) => ({ gameId: game.id, slug: c.slug, name: c.name, summary: c.summary })))
      .onDuplicateKeyUpdate({ set: updateAllBut(characters, ["id", "gameId", "slug", "createdAt"]) });
    const characterRows = await tx.select().from(characters).where(eq(characters.gameId, game.id));
    const characterId = new Map(characterRows.map((c) => [c.slug, c.id]));

    const written = await tx.select({ slug: editions.slug }).from(editions).where(eq(editions.gameId, game.id));
    const missing = EDITIONS.filter((e) => !written.some((w) => w.slug === e.slug));
    if (missing.length > 0) await tx.insert(editions).values(missing.map((e) => ({ gameId: game.id, ...e })));
    const editionRows = await tx.select().from(editions).where(eq(editions.gameId, game.id));

    const report: SeedReport = {
      game: 1,
      editions: editionRows.length,
      published: 0,
      characters: characterRows.length,
      stances: 0,
      moves: 0,
      edges: 0,
    };
    for (const edition of editionRows) {
      const spec = EDITIONS.find((e) => e.slug === edition.slug);
      if (!spec || edition.status === "published") continue;
      for (const character of cast) {
        const cid = characterId.get(character.slug);
        if (cid === undefined) throw new Error(`character ${character.slug} was not written`);
        const counts = await writeCharacterEdition(tx, edition.id, cid, character.data(spec.slug));
        report.stances += counts.stances;
        report.moves += counts.moves;
        report.edges += counts.edges;
      }
      await tx
        .update(editions)
        .set({ status: "published", publishedAt: new Date() })
        .where(eq(editions.id, edition.id));
      report.published += 1;
    }
    return report;
  });
}

async function writeCharacterEdition(tx: Tx, editionId: number, characterId: number, data: CharacterData) {
  const { moves: moveRows, edges: edgeRows } = flatten(data);
  const scope = { editionId, characterId };

  await tx
    .insert(stances)
    .values(
      data.stances.map((s) => ({
        ...scope,
        key: s.key,
        name: s.name,
        abbreviation: s.abbreviation,
        notes: s.notes ?? null,
      })),
    )
    .onDuplicateKeyUpdate({ set: updateAllBut(stances, ["id", "editionId", "characterId", "key"]) });
  const stanceRows = await tx
    .select({ id: stances.id, key: stances.key })
    .from(stances)
    .where(and(eq(stances.editionId, editionId), eq(stances.characterId, characterId)));
  const stanceId = new Map(stanceRows.map((s) => [s.key, s.id]));

  const newMoves: NewMove[] = moveRows.map((m) => ({
    ...scope,
    key: m.key,
    input: m.input,
    name: m.hit.name,
    level: m.hit.level,
    damage: m.hit.damage,
    startup: m.hit.startup ?? null,
    onBlock: m.hit.onBlock,
    onHit: m.hit.onHit,
    onCounterHit: m.hit.onCounterHit,
    range: m.hit.range === undefined ? null : String(m.hit.range),
    tags: m.hit.tags ?? [],
    notes: m.hit.notes ?? null,
    fromPosture: m.hit.from ?? postureOf(m.input),
    stanceId: m.stance === null ? null : (stanceId.get(m.stance) ?? null),
    sort: m.sort,
  }));
  await tx
    .insert(moves)
    .values(newMoves)
    .onDuplicateKeyUpdate({ set: updateAllBut(moves, ["id", "editionId", "characterId", "key"]) });
  const moveIdRows = await tx
    .select({ id: moves.id, key: moves.key })
    .from(moves)
    .where(and(eq(moves.editionId, editionId), eq(moves.characterId, characterId)));
  const moveId = new Map(moveIdRows.map((m) => [m.key, m.id]));

  const idOf = (end: { move: string } | { stance: string }) => {
    const found = "move" in end ? moveId.get(end.move) : stanceId.get(end.stance);
    if (found === undefined) throw new Error(`edge end ${JSON.stringify(end)} has no row`);
    return found;
  };
  const newEdges: NewEdge[] = edgeRows.map((e) => ({
    ...scope,
    key: e.key,
    kind: e.kind,
    input: e.input,
    fromMoveId: "move" in e.from ? idOf(e.from) : null,
    fromStanceId: "stance" in e.from ? idOf(e.from) : null,
    toMoveId: "move" in e.to ? idOf(e.to) : null,
    toStanceId: "stance" in e.to ? idOf(e.to) : null,
    gapOnBlock: e.follow?.gapOnBlock ?? null,
    comboOnHit: e.follow?.comboOnHit ?? null,
    comboOnCounterHit: e.follow?.comboOnCounterHit ?? null,
    onBlock: e.cancel?.onBlock ?? null,
    onHit: e.cancel?.onHit ?? null,
    onCounterHit: e.cancel?.onCounterHit ?? null,
    autoGuard: e.cancel?.autoGuard ?? null,
  }));
  await tx
    .insert(edges)
    .values(newEdges)
    .onDuplicateKeyUpdate({ set: updateAllBut(edges, ["id", "editionId", "characterId", "key"]) });

  // Rows the scenario no longer has (edges first: they point at moves and stances).
  const inScope = (table: typeof edges | typeof moves | typeof stances) =>
    and(eq(table.editionId, editionId), eq(table.characterId, characterId));
  await tx.delete(edges).where(
    and(
      inScope(edges),
      notInArray(
        edges.key,
        edgeRows.map((e) => e.key),
      ),
    ),
  );
  await tx.delete(moves).where(
    and(
      inScope(moves),
      notInArray(
        moves.key,
        moveRows.map((m) => m.key),
      ),
    ),
  );
  await tx.delete(stances).where(
    and(
      inScope(stances),
      notInArray(
        stances.key,
        data.stances.map((s) => s.key),
      ),
    ),
  );

  return { stances: data.stances.length, moves: moveRows.length, edges: edgeRows.length };
}

/**
 * Writes one more character into an existing game, in every draft Edition it has (a published
 * Edition is frozen; the demo's extra characters go through seedDemo's `extraCharacters`).
 */
export async function seedCharacter(db: Database, gameSlug: string, character: DemoCharacter): Promise<number> {
  return db.transaction(async (tx) => {
    const [game] = await tx.select({ id: games.id }).from(games).where(eq(games.slug, gameSlug));
    if (!game) throw new Error(`no game ${gameSlug}`);
    await tx
      .insert(characters)
      .values({ gameId: game.id, slug: character.slug, name: character.name, summary: character.summary })
      .onDuplicateKeyUpdate({ set: updateAllBut(characters, ["id", "gameId", "slug", "createdAt"]) });
    const [row] = await tx
      .select({ id: characters.id })
      .from(characters)
      .where(and(eq(characters.gameId, game.id), eq(characters.slug, character.slug)));
    if (!row) throw new Error(`character ${character.slug} was not written`);
    const drafts = await tx
      .select()
      .from(editions)
      .where(and(eq(editions.gameId, game.id), eq(editions.status, "draft")));
    for (const edition of drafts) {
      await writeCharacterEdition(tx, edition.id, row.id, character.data(edition.slug as EditionSlug));
    }
    return row.id;
  });
}
