import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { GraphEdge, MoveGraph } from "@/lib/engine";
import type { Starter } from "@/lib/explorer";
import { getDb } from "../index";
import { edges, moves, stances } from "../schema";
import type { CancelEntry, MoveEntry, MoveList } from "@/lib/dto";

type Scope = { characterId: number; editionId: number };

/** The rows of one character in one edition: stances, moves in list order, edges. */
async function loadRows({ characterId, editionId }: Scope) {
  const db = getDb();
  const [stanceRows, moveRows, edgeRows] = await Promise.all([
    db
      .select({
        id: stances.id,
        key: stances.key,
        name: stances.name,
        abbreviation: stances.abbreviation,
        notes: stances.notes,
      })
      .from(stances)
      .where(and(eq(stances.characterId, characterId), eq(stances.editionId, editionId)))
      .orderBy(asc(stances.id)),
    db
      .select()
      .from(moves)
      .where(and(eq(moves.characterId, characterId), eq(moves.editionId, editionId)))
      .orderBy(asc(moves.sort), asc(moves.id)),
    db
      .select()
      .from(edges)
      .where(and(eq(edges.characterId, characterId), eq(edges.editionId, editionId)))
      .orderBy(asc(edges.id)),
  ]);
  return { stanceRows, moveRows, edgeRows };
}

/** Node id of a stance in the engine's graph; moves use their key as it is. */
export const stanceNodeId = (key: string) => `stance:${key}`;

/**
 * One character's frame data in one edition as the engine's graph. Node and
 * edge ids are the rows' keys, stable across editions, so a selected path
 * means the same moves in every edition that has them.
 */
export async function getCharacterGraph(
  scope: Scope,
): Promise<{ graph: MoveGraph; roots: string[]; starters: Starter[] }> {
  const { stanceRows, moveRows, edgeRows } = await loadRows(scope);
  const moveKey = new Map(moveRows.map((m) => [m.id, m.key]));
  const stanceKey = new Map(stanceRows.map((s) => [s.id, stanceNodeId(s.key)]));
  const end = (moveId: number | null, stanceId: number | null) =>
    (moveId !== null ? moveKey.get(moveId) : stanceId !== null ? stanceKey.get(stanceId) : undefined) ?? "";

  const graphEdges: GraphEdge[] = edgeRows.map((e) => {
    const base = {
      id: e.key,
      from: end(e.fromMoveId, e.fromStanceId),
      to: end(e.toMoveId, e.toStanceId),
      input: e.input,
    };
    switch (e.kind) {
      case "follow":
        return {
          ...base,
          kind: "follow",
          gapOnBlock: e.gapOnBlock ?? 0,
          comboOnHit: e.comboOnHit ?? false,
          comboOnCounterHit: e.comboOnCounterHit ?? false,
        };
      case "cancel":
        return {
          ...base,
          kind: "cancel",
          onBlock: e.onBlock ?? 0,
          onHit: e.onHit ?? 0,
          onCounterHit: e.onCounterHit ?? 0,
          autoGuard: e.autoGuard ?? [],
        };
      case "enter":
        return { ...base, kind: "enter" };
    }
  });
  const graph: MoveGraph = {
    nodes: [
      ...moveRows.map((m) => ({
        id: m.key,
        kind: "move" as const,
        input: m.input,
        name: m.name,
        level: m.level,
        damage: m.damage,
        ...(m.startup === null ? {} : { startup: m.startup }),
        onBlock: m.onBlock,
        onHit: m.onHit,
        onCounterHit: m.onCounterHit,
        ...(m.range === null ? {} : { range: m.range }),
        tags: m.tags,
        ...(m.notes === null ? {} : { notes: m.notes }),
      })),
      ...stanceRows.map((s) => ({ id: stanceNodeId(s.key), kind: "stance" as const, name: s.name })),
    ],
    edges: graphEdges,
  };
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
  const { stanceRows, moveRows, edgeRows } = await loadRows(scope);
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
    moves: moveRows.map((m) => ({
      id: m.id,
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
      stance: m.stanceId === null ? null : (stanceById.get(m.stanceId) ?? null),
      via: incoming.get(m.id) ?? null,
      depth: depthOf(m.id),
    })),
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
