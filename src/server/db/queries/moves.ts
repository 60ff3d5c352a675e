import "server-only";
import { and, eq } from "drizzle-orm";
import { stanceNodeId, toMoveGraph } from "@/lib/character-file";
import type { MoveGraph } from "@/lib/engine";
import type { Starter } from "@/lib/explorer";
import { getDb } from "../index";
import { moves, stances } from "../schema";
import { loadCharacterRows, portableRows } from "./character-io";
import type { CancelEntry, MoveEntry, MoveList } from "@/lib/dto";

type Scope = { characterId: number; editionId: number };

/**
 * One character's frame data in one edition as the engine's graph. Node and
 * edge ids are the rows' keys, stable across editions, so a selected path
 * means the same moves in every edition that has them.
 */
export async function getCharacterGraph(
  scope: Scope,
): Promise<{ graph: MoveGraph; roots: string[]; starters: Starter[] }> {
  const rows = await loadCharacterRows(getDb(), scope);
  const { stanceRows, moveRows } = rows;
  const stanceKey = new Map(stanceRows.map((s) => [s.id, stanceNodeId(s.key)]));
  const items = portableRows(rows);
  const mapped = toMoveGraph({
    character: { slug: "", name: "", summary: null },
    stances: items.stances.map((s) => s.item),
    moves: items.moves.map((m) => m.item),
    edges: items.edges.map((e) => e.item),
  });
  // The file layer's mapping, with each edge's id its row's stored key.
  const graphEdges = mapped.edges.map((e, i) => ({ ...e, id: items.edges[i]!.key }));
  const graph: MoveGraph = { nodes: mapped.nodes, edges: graphEdges };
  const reached = new Set(graphEdges.filter((e) => e.kind === "follow").map((e) => e.to));
  const rootRows = moveRows.filter((m) => !reached.has(m.key));
  const starters: Starter[] = rootRows
    .filter((m) => m.startup !== null)
    .map((m) => ({
      id: m.key,
      input: m.input,
      name: m.name,
      startup: m.startup ?? 0,
      damage: m.damage,
      from: m.fromPosture,
      stance: m.stanceId === null ? null : (stanceKey.get(m.stanceId) ?? null),
    }));
  return { graph, roots: rootRows.map((m) => m.key), starters };
}

/** A character's frame data in one edition, in move-list order. */
export async function getMoveList(scope: Scope): Promise<MoveList> {
  const rows = await loadCharacterRows(getDb(), scope);
  const { moveRows, edgeRows } = rows;
  const moveItems = portableRows(rows).moves;
  const stanceRows = rows.stanceRows.map(({ id, key, name, abbreviation, notes }) => ({
    id,
    key,
    name,
    abbreviation,
    notes,
  }));
  const stanceById = new Map(stanceRows.map((s) => [s.id, s]));
  const incoming = new Map<number, MoveEntry["via"]>();
  const cancels: CancelEntry[] = [];
  for (const e of edgeRows) {
    if (e.kind === "follow" && e.toMoveId !== null && e.fromMoveId !== null) {
      incoming.set(e.toMoveId, {
        kind: "follow",
        fromId: e.fromMoveId,
        input: e.input,
        gapOnBlock: e.gapOnBlock ?? 0,
        comboOnHit: e.comboOnHit ?? false,
        comboOnCounterHit: e.comboOnCounterHit ?? false,
      });
    } else if (e.kind === "enter" && e.toMoveId !== null) {
      incoming.set(e.toMoveId, { kind: "enter", input: e.input });
    } else if (e.kind === "cancel" && e.fromMoveId !== null && e.toStanceId !== null) {
      const stance = stanceById.get(e.toStanceId);
      if (!stance || e.onBlock === null || e.onHit === null || e.onCounterHit === null) continue;
      cancels.push({
        id: e.id,
        key: e.key,
        fromId: e.fromMoveId,
        input: e.input,
        stance,
        onBlock: e.onBlock,
        onHit: e.onHit,
        onCounterHit: e.onCounterHit,
        autoGuard: e.autoGuard ?? [],
      });
    }
  }

  const depth = new Map<number, number>();
  const depthOf = (id: number, guard = 0): number => {
    const known = depth.get(id);
    if (known !== undefined) return known;
    const via = incoming.get(id);
    const d = via?.kind === "follow" && guard < 64 ? depthOf(via.fromId, guard + 1) + 1 : 0;
    depth.set(id, d);
    return d;
  };

  return {
    stances: stanceRows,
    moves: moveRows.map((m, i) => {
      const { fromPosture: _posture, stance: _stanceKey, ...fields } = moveItems[i]!.item;
      return {
        id: m.id,
        version: m.version,
        ...fields,
        stance: m.stanceId === null ? null : (stanceById.get(m.stanceId) ?? null),
        via: incoming.get(m.id) ?? null,
        depth: depthOf(m.id),
      };
    }),
    cancels,
  };
}

/** Whether the character has a move with this key in any Edition. */
export async function hasMove({ characterId, key }: { characterId: number; key: string }): Promise<boolean> {
  const [row] = await getDb()
    .select({ id: moves.id })
    .from(moves)
    .where(and(eq(moves.characterId, characterId), eq(moves.key, key)))
    .limit(1);
  return row !== undefined;
}

/** The keys of one character's moves and stances in one Edition. */
export async function readEditionKeys({
  editionId,
  characterId,
}: {
  editionId: number;
  characterId: number;
}): Promise<{ moves: string[]; stances: string[] }> {
  const scope = (t: typeof moves | typeof stances) => and(eq(t.editionId, editionId), eq(t.characterId, characterId));
  const [moveRows, stanceRows] = await Promise.all([
    getDb().select({ key: moves.key }).from(moves).where(scope(moves)),
    getDb().select({ key: stances.key }).from(stances).where(scope(stances)),
  ]);
  return { moves: moveRows.map((r) => r.key), stances: stanceRows.map((r) => r.key) };
}
