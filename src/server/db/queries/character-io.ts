import "server-only";
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import {
  orderEdges,
  type FileProblem,
  type PortableCharacter,
  type PortableEdge,
  type PortableMove,
  type PortableStance,
  edgeKey,
} from "@/lib/character-file";
import type { ImportCounts, ImportPreview, ImportSection } from "@/lib/dto";
import type { FieldChange } from "@/lib/engine";
import { AppError } from "@/lib/errors";
import { getDb } from "../index";
import { characters, edges, moves, stances } from "../schema";
import { recordAudit, type Executor } from "./audit";
import { lockDraft } from "./authoring";

/**
 * Character files in and out of the database (README, "Bring your own game"): one character's
 * rows of one Edition as the file layer's `PortableCharacter`, and a file written back into a
 * draft Edition by key: what the file has and the Edition lacks is added, what differs is
 * changed in place (same id, `version` + 1), what the Edition has and the file lacks is removed.
 *
 * The file names its character by slug; it must be the target's (an Edition file may carry
 * several, and the one with the target's slug is taken). The character's name and summary
 * belong to the game across all its Editions, so an import into one draft does not change
 * them: the preview says when the file's differ.
 */

type Scope = { editionId: number; characterId: number };
export type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

/** Rows per INSERT: a 10,000-move character goes in a handful of statements, each well under the packet limit. */
const BATCH = 1000;

export interface Rows {
  stanceRows: (typeof stances.$inferSelect)[];
  moveRows: (typeof moves.$inferSelect)[];
  edgeRows: (typeof edges.$inferSelect)[];
}

/** One character's rows in one Edition: stances in the order made, moves in list order, edges in the order made. */
export async function loadCharacterRows(db: Executor, { editionId, characterId }: Scope): Promise<Rows> {
  const [stanceRows, moveRows, edgeRows] = await Promise.all([
    db
      .select()
      .from(stances)
      .where(and(eq(stances.editionId, editionId), eq(stances.characterId, characterId)))
      .orderBy(asc(stances.id)),
    db
      .select()
      .from(moves)
      .where(and(eq(moves.editionId, editionId), eq(moves.characterId, characterId)))
      .orderBy(asc(moves.sort), asc(moves.id)),
    db
      .select()
      .from(edges)
      .where(and(eq(edges.editionId, editionId), eq(edges.characterId, characterId)))
      .orderBy(asc(edges.id)),
  ]);
  return { stanceRows, moveRows, edgeRows };
}

function stanceOf(s: typeof stances.$inferSelect): PortableStance {
  return { key: s.key, name: s.name, abbreviation: s.abbreviation, notes: s.notes };
}

/** The rows as the file layer's items (references by key), each with its row's id; edges with their stored key. */
export function portableRows({ stanceRows, moveRows, edgeRows }: Rows) {
  const stanceKey = new Map(stanceRows.map((s) => [s.id, s.key]));
  const moveKey = new Map(moveRows.map((m) => [m.id, m.key]));
  const ps = stanceRows.map((s) => ({ id: s.id, item: stanceOf(s) }));
  const pm = moveRows.map((m) => ({
    id: m.id,
    item: {
      key: m.key,
      input: m.input,
      name: m.name,
      level: m.level,
      damage: m.damage,
      startup: m.startup,
      onBlock: m.onBlock,
      onHit: m.onHit,
      onCounterHit: m.onCounterHit,
      range: m.range,
      tags: m.tags,
      notes: m.notes,
      fromPosture: m.fromPosture,
      stance: m.stanceId === null ? null : (stanceKey.get(m.stanceId) ?? null),
    } satisfies PortableMove,
  }));
  const end = (move: number | null, stance: number | null) =>
    (move !== null ? moveKey.get(move) : stance !== null ? stanceKey.get(stance) : undefined) ?? "";
  const pe = edgeRows.map((e) => {
    const base = { from: end(e.fromMoveId, e.fromStanceId), to: end(e.toMoveId, e.toStanceId), input: e.input };
    const item: PortableEdge =
      e.kind === "follow"
        ? {
            kind: "follow",
            ...base,
            gapOnBlock: e.gapOnBlock ?? 0,
            comboOnHit: e.comboOnHit ?? false,
            comboOnCounterHit: e.comboOnCounterHit ?? false,
          }
        : e.kind === "cancel"
          ? {
              kind: "cancel",
              ...base,
              onBlock: e.onBlock ?? 0,
              onHit: e.onHit ?? 0,
              onCounterHit: e.onCounterHit ?? 0,
              autoGuard: e.autoGuard ?? [],
            }
          : { kind: "enter", ...base };
    return { id: e.id, key: e.key, item };
  });
  return { stances: ps, moves: pm, edges: pe };
}

/** A character's rows as a file carries them: its name and summary, stances, moves in list order, edges grouped by move. */
export function portableCharacterOf(
  info: { slug: string; name: string; summary: string | null },
  rows: Rows,
): PortableCharacter {
  const items = portableRows(rows);
  const moveItems = items.moves.map((m) => m.item);
  return {
    character: { slug: info.slug, name: info.name, summary: info.summary },
    stances: items.stances.map((s) => s.item),
    moves: moveItems,
    edges: orderEdges(
      moveItems,
      items.edges.map((e) => e.item),
    ),
  };
}

/** One character of one Edition as a file carries it; null when the character does not exist. */
export async function loadPortableCharacter({ editionId, characterId }: Scope): Promise<PortableCharacter | null> {
  const db = getDb();
  const [info] = await db.select().from(characters).where(eq(characters.id, characterId));
  if (!info) return null;
  return portableCharacterOf(info, await loadCharacterRows(db, { editionId, characterId }));
}

/** Every character of a game with frame data in the Edition, in the order they were made. */
export async function loadPortableEdition({
  editionId,
  gameId,
}: {
  editionId: number;
  gameId: number;
}): Promise<PortableCharacter[]> {
  const db = getDb();
  const list = await db
    .select({ id: characters.id })
    .from(characters)
    .where(
      and(
        eq(characters.gameId, gameId),
        sql`(exists (select 1 from ${moves} where ${moves.characterId} = ${characters.id} and ${moves.editionId} = ${editionId})
          or exists (select 1 from ${stances} where ${stances.characterId} = ${characters.id} and ${stances.editionId} = ${editionId}))`,
      ),
    )
    .orderBy(asc(characters.id));
  const out: PortableCharacter[] = [];
  for (const { id } of list) {
    const c = await loadPortableCharacter({ editionId, characterId: id });
    if (c) out.push(c);
  }
  return out;
}

// ---------------------------------------------------------------------------
// Import

export type { ImportCounts, ImportPreview, ImportSection } from "@/lib/dto";

export type ImportResult =
  { ok: true; preview: ImportPreview; counts: ImportCounts; applied: boolean } | { ok: false; problems: FileProblem[] };

/**
 * Every field whose value differs (deep equality through JSON, a field on one side only
 * counting with null on the other), except `key`, sorted by name: `diffGraphs`' rule.
 */
export function fieldChanges(before: object, after: object): FieldChange[] {
  const a = before as Record<string, unknown>;
  const b = after as Record<string, unknown>;
  const fields = [...new Set([...Object.keys(a), ...Object.keys(b)])].filter((f) => f !== "key").sort();
  const out: FieldChange[] = [];
  for (const field of fields) {
    const x = a[field] ?? null;
    const y = b[field] ?? null;
    if (JSON.stringify(x) !== JSON.stringify(y)) out.push({ field, before: x, after: y });
  }
  return out;
}

function section<T>(
  existing: readonly { key: string; item: T }[],
  incoming: readonly { key: string; item: T }[],
): ImportSection {
  const old = new Map(existing.map((e) => [e.key, e.item]));
  const now = new Set(incoming.map((i) => i.key));
  const out: ImportSection = { added: [], changed: [], removed: [] };
  for (const { key, item } of incoming) {
    const before = old.get(key);
    if (before === undefined) out.added.push(key);
    else {
      const changes = fieldChanges(before as object, item as object);
      if (changes.length > 0) out.changed.push({ key, changes });
    }
  }
  for (const { key } of existing) if (!now.has(key)) out.removed.push(key);
  return out;
}

const edgeItem = (e: PortableEdge) => ({ key: edgeKey(e), item: e });

/**
 * Keys the file holds apart that the database takes for one (its keys compare without case
 * and accents, as `utf8mb4_unicode_ci` does: `a` and `A`, `e` and `é`). Asked of MariaDB
 * itself in one query, so the answer is its own collation's.
 */
export async function collidingKeys(tx: Tx, what: string, keys: string[]): Promise<FileProblem[]> {
  if (keys.length < 2) return [];
  const result = (await tx.execute(sql`
    select group_concat(k order by n separator '\u001f') as same
    from json_table(${JSON.stringify(keys)}, '$[*]' columns (n for ordinality, k varchar(96) path '$')) t
    group by k collate utf8mb4_unicode_ci having count(*) > 1`)) as unknown as [{ same: string }[]];
  return result[0].map((row) => {
    const same = row.same.split("\u001f");
    return {
      message: `the ${what} keys ${same.map((k) => `"${k}"`).join(" and ")} differ only in case or accents, which Framefork counts as the same key; give them keys that differ in letters`,
    };
  });
}

/**
 * What writing `file` over the character's rows would add, change (field by field) and remove, by
 * key, and which unchanged moves change place in the list. Pure: the rows were read by the caller.
 */
export function compareCharacter(
  rows: Rows,
  file: PortableCharacter,
  target: { slug: string; name: string; summary: string | null },
): { preview: ImportPreview; reordered: { key: string; sort: number }[] } {
  const have = portableRows(rows);
  const preview: ImportPreview = {
    character: target.slug,
    stances: section(
      have.stances.map((s) => ({ key: s.item.key, item: s.item })),
      file.stances.map((s) => ({ key: s.key, item: s })),
    ),
    moves: section(
      have.moves.map((m) => ({ key: m.item.key, item: m.item })),
      file.moves.map((m) => ({ key: m.key, item: m })),
    ),
    edges: section(
      have.edges.map((e) => ({ key: e.key, item: e.item })),
      file.edges.map(edgeItem),
    ),
    reordered: 0,
    kept: fieldChanges(
      { name: target.name, summary: target.summary },
      { name: file.character.name, summary: file.character.summary },
    ),
  };
  const sortOf = new Map(rows.moveRows.map((m) => [m.key, m.sort]));
  const changedMoves = new Set(preview.moves.changed.map((c) => c.key));
  const reordered = file.moves.flatMap((m, sort) => {
    const was = sortOf.get(m.key);
    return was !== undefined && was !== sort && !changedMoves.has(m.key) ? [{ key: m.key, sort }] : [];
  });
  preview.reordered = reordered.length;
  return { preview, reordered };
}

/**
 * Reads the target, compares the file's character with it and, when `apply`, writes the
 * difference, all in one transaction that holds the draft's lock (a published Edition is
 * refused with 409 before anything is compared). Without `apply` nothing is written.
 */
export async function importCharacter({
  teamId,
  gameId,
  editionId,
  characterId,
  actorId,
  character: file,
  apply,
}: {
  teamId: number;
  gameId: number;
  editionId: number;
  characterId: number;
  actorId: string;
  character: PortableCharacter;
  apply: boolean;
}): Promise<ImportResult> {
  return getDb().transaction(async (tx) => {
    const draft = await lockDraft(tx, gameId, editionId);
    const [target] = await tx.select().from(characters).where(eq(characters.id, characterId));
    if (!target || target.gameId !== gameId) throw new AppError("not_found", "No such character in this game.");
    if (file.character.slug !== target.slug) {
      return {
        ok: false,
        problems: [
          {
            message: `the file is for the character "${file.character.slug}", not "${target.slug}"; import it into that character, or change the slug in the file's character row to "${target.slug}"`,
          },
        ],
      };
    }
    const problems = [
      ...(await collidingKeys(
        tx,
        "stance",
        file.stances.map((s) => s.key),
      )),
      ...(await collidingKeys(
        tx,
        "move",
        file.moves.map((m) => m.key),
      )),
      ...(await collidingKeys(tx, "edge", file.edges.map(edgeKey))),
    ];
    if (problems.length > 0) return { ok: false, problems };

    const rows = await loadCharacterRows(tx, { editionId, characterId });
    const { preview, reordered } = compareCharacter(rows, file, target);
    const counts = Object.fromEntries(
      (["stances", "moves", "edges"] as const).map((part) => [
        part,
        {
          added: preview[part].added.length,
          changed: preview[part].changed.length,
          removed: preview[part].removed.length,
        },
      ]),
    ) as ImportCounts;
    if (!apply) return { ok: true, preview, counts, applied: false };

    await writeCharacter(tx, { editionId, characterId }, rows, file, preview, reordered);
    await recordAudit(tx, {
      teamId,
      actorId,
      action: "character.imported",
      detail: {
        edition: draft.slug,
        character: target.slug,
        ...Object.fromEntries(
          (["stances", "moves", "edges"] as const).flatMap((part) =>
            (["added", "changed", "removed"] as const).map((k) => [`${part}_${k}`, counts[part][k]]),
          ),
        ),
      },
    });
    return { ok: true, preview, counts, applied: true };
  });
}

function chunks<T>(xs: readonly T[]): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < xs.length; i += BATCH) out.push(xs.slice(i, i + BATCH));
  return out;
}

/** `col = values(col)` for each column: the upsert's update takes the new row's value. */
const fromNewRow = (cols: string[]) =>
  Object.fromEntries(cols.map((c) => [c, sql.raw(`values(\`${c.replace(/[A-Z]/g, (l) => `_${l.toLowerCase()}`)}\`)`)]));

/**
 * The difference written set by set: removals first (edges, then moves and stances, so the
 * database never holds two rows whose keys it counts as one), then stances, moves and edges
 * each in batched upserts on their unique key. A changed row keeps its id and gets
 * `version + 1`; an unchanged one is not touched, except a move whose place in the list moved.
 */
export async function writeCharacter(
  tx: Tx,
  scope: Scope,
  rows: Rows,
  file: PortableCharacter,
  preview: ImportPreview,
  reordered: { key: string; sort: number }[],
): Promise<void> {
  const { editionId, characterId } = scope;
  const idOf = <R extends { id: number; key: string }>(list: R[], keys: string[]) => {
    const wanted = new Set(keys);
    return list.filter((r) => wanted.has(r.key)).map((r) => r.id);
  };
  for (const ids of chunks(idOf(rows.edgeRows, preview.edges.removed)))
    await tx.delete(edges).where(inArray(edges.id, ids));
  for (const ids of chunks(idOf(rows.moveRows, preview.moves.removed)))
    await tx.delete(moves).where(inArray(moves.id, ids));
  for (const ids of chunks(idOf(rows.stanceRows, preview.stances.removed)))
    await tx.delete(stances).where(inArray(stances.id, ids));

  const touched = (s: ImportSection) => new Set([...s.added, ...s.changed.map((c) => c.key)]);
  const bump = { version: sql`${sql.raw("`version`")} + 1` };

  const stanceKeys = touched(preview.stances);
  const stanceRows = file.stances.filter((s) => stanceKeys.has(s.key)).map((s) => ({ editionId, characterId, ...s }));
  for (const batch of chunks(stanceRows))
    await tx
      .insert(stances)
      .values(batch)
      .onDuplicateKeyUpdate({ set: { ...fromNewRow(["name", "abbreviation", "notes"]), ...bump } });
  const stanceId = new Map(
    (
      await tx
        .select({ id: stances.id, key: stances.key })
        .from(stances)
        .where(and(eq(stances.editionId, editionId), eq(stances.characterId, characterId)))
    ).map((s) => [s.key, s.id]),
  );

  const moveKeys = touched(preview.moves);
  const moveRows = file.moves.flatMap(({ stance, ...m }, sort) =>
    moveKeys.has(m.key)
      ? [{ editionId, characterId, ...m, stanceId: stance === null ? null : stanceId.get(stance)!, sort }]
      : [],
  );
  const moveCols = [
    "input",
    "name",
    "level",
    "damage",
    "startup",
    "onBlock",
    "onHit",
    "onCounterHit",
    "range",
    "tags",
    "notes",
    "fromPosture",
    "stanceId",
    "sort",
  ];
  for (const batch of chunks(moveRows))
    await tx
      .insert(moves)
      .values(batch)
      .onDuplicateKeyUpdate({ set: { ...fromNewRow(moveCols), ...bump } });
  // A move that only changed place: its new sort, no new version.
  const byKey = new Map(rows.moveRows.map((m) => [m.key, m]));
  for (const batch of chunks(reordered)) {
    const old = batch.map(({ key, sort }) => ({ ...byKey.get(key)!, sort }));
    await tx
      .insert(moves)
      .values(old)
      .onDuplicateKeyUpdate({ set: fromNewRow(["sort"]) });
  }
  const moveId = new Map(
    (
      await tx
        .select({ id: moves.id, key: moves.key })
        .from(moves)
        .where(and(eq(moves.editionId, editionId), eq(moves.characterId, characterId)))
    ).map((m) => [m.key, m.id]),
  );

  const edgeKeys = touched(preview.edges);
  const edgeRows = file.edges.flatMap((e): (typeof edges.$inferInsert)[] => {
    const key = edgeKey(e);
    if (!edgeKeys.has(key)) return [];
    const none = {
      fromMoveId: null,
      fromStanceId: null,
      toMoveId: null,
      toStanceId: null,
      gapOnBlock: null,
      comboOnHit: null,
      comboOnCounterHit: null,
      onBlock: null,
      onHit: null,
      onCounterHit: null,
      autoGuard: null,
    };
    const base = { editionId, characterId, key, kind: e.kind, input: e.input, ...none };
    switch (e.kind) {
      case "follow":
        return [
          {
            ...base,
            fromMoveId: moveId.get(e.from)!,
            toMoveId: moveId.get(e.to)!,
            gapOnBlock: e.gapOnBlock,
            comboOnHit: e.comboOnHit,
            comboOnCounterHit: e.comboOnCounterHit,
          },
        ];
      case "cancel":
        return [
          {
            ...base,
            fromMoveId: moveId.get(e.from)!,
            toStanceId: stanceId.get(e.to)!,
            onBlock: e.onBlock,
            onHit: e.onHit,
            onCounterHit: e.onCounterHit,
            autoGuard: e.autoGuard,
          },
        ];
      case "enter":
        return [{ ...base, fromStanceId: stanceId.get(e.from)!, toMoveId: moveId.get(e.to)! }];
    }
  });
  const edgeCols = [
    "kind",
    "fromMoveId",
    "fromStanceId",
    "toMoveId",
    "toStanceId",
    "input",
    "gapOnBlock",
    "comboOnHit",
    "comboOnCounterHit",
    "onBlock",
    "onHit",
    "onCounterHit",
    "autoGuard",
  ];
  for (const batch of chunks(edgeRows))
    await tx
      .insert(edges)
      .values(batch)
      .onDuplicateKeyUpdate({ set: { ...fromNewRow(edgeCols), ...bump } });
}
