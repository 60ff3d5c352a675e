import type { z } from "zod";
import { rangeProblem, type RangeScale } from "../engine/range";
import { graphIssues } from "../engine/schema";
import { coachErrorMap, formatProblem, type FileProblem } from "./problems";
import {
  characterInfoSchema,
  edgeKey,
  MAX_EDGE_KEY,
  orderEdges,
  portableEdgeSchema,
  portableMoveSchema,
  portableStanceSchema,
  toMoveGraph,
  type CharacterInfo,
  type PortableCharacter,
  type PortableEdge,
  type PortableMove,
  type PortableStance,
} from "./schema";

export type Part = "character" | "stances" | "moves" | "edges";

/** What a file is read against beyond its own format: the game's way of measuring range. */
export interface ReadOptions {
  /** Given for a game that measures range in numbers: each move's range must then be one. */
  range?: RangeScale;
}
export type Where = Omit<FileProblem, "message">;

/**
 * Where an item or one of its fields sits in the file: a JSON path, or a CSV line and
 * column. `field` is the item's field (e.g. `onBlock`), or undefined for the item itself.
 */
export type Locate = (part: Part, index: number, field?: PropertyKey[]) => Where;

/** A character before validation: what a file gave for each part, not yet trusted. */
export interface RawCharacter {
  character: unknown;
  stances: unknown[];
  moves: unknown[];
  edges: unknown[];
}

const KIND_ENDS = {
  follow: { from: "move", to: "move" },
  cancel: { from: "move", to: "stance" },
  enter: { from: "stance", to: "move" },
} as const;

const SAYS = {
  follow: "a follow goes from a move to a move",
  cancel: "a cancel goes from a move into a stance",
  enter: "an enter goes from a stance to a move",
};

function where(w: Where): string {
  const text = formatProblem({ ...w, message: "" });
  return text.endsWith(": ") ? text.slice(0, -2) : "the file";
}

/**
 * Validates one character field by field and then as a whole: every field against the
 * schema, then keys unique, every reference known and of the right kind, edge keys that
 * fit the database, and no loop of follows (a string may come back only through a
 * stance). Items that fail their schema still count as known keys, so one typo does
 * not also show up as a dozen unknown references.
 */
export function validateCharacter(
  raw: RawCharacter,
  locate: Locate,
  options: ReadOptions = {},
): { character: PortableCharacter; problems: [] } | { character: null; problems: FileProblem[] } {
  const problems: FileProblem[] = [];
  const report = (w: Where, message: string) => problems.push({ ...w, message });

  const check = <S extends z.ZodType>(schema: S, value: unknown, part: Part, index: number): z.output<S> | null => {
    const r = schema.safeParse(value, { error: coachErrorMap });
    if (r.success) return r.data;
    for (const issue of r.error.issues) report(locate(part, index, issue.path), issue.message);
    return null;
  };

  const info: CharacterInfo | null = check(characterInfoSchema, raw.character, "character", 0);

  const stanceAt = new Map<string, number>();
  const moveAt = new Map<string, number>();
  const rawKey = (v: unknown, fallback?: string): string | null => {
    if (typeof v !== "object" || v === null) return null;
    const o = v as Record<string, unknown>;
    const k = typeof o.key === "string" && o.key.trim() !== "" ? o.key : fallback ? o[fallback] : undefined;
    return typeof k === "string" ? k.trim() : null;
  };

  /** Records an item's key, or reports it as taken. Returns nothing: later checks read the maps. */
  const claim = (part: "stances" | "moves", key: string | null, index: number) => {
    if (key === null) return;
    const [own, word] = part === "stances" ? [stanceAt, "stance"] : [moveAt, "move"];
    const first = own.get(key);
    if (first !== undefined) {
      report(
        locate(part, index, ["key"]),
        `${word} key "${key}" is used twice (first at ${where(locate(part, first))})`,
      );
    } else if (part === "moves" && stanceAt.has(key)) {
      report(locate(part, index, ["key"]), `"${key}" is already a stance's key; give the move a key of its own`);
    } else own.set(key, index);
  };

  const stances: (PortableStance & { index: number })[] = [];
  raw.stances.forEach((value, index) => {
    const s = check(portableStanceSchema, value, "stances", index);
    claim("stances", s?.key ?? rawKey(value), index);
    if (s) stances.push({ ...s, index });
  });

  const moves: (PortableMove & { index: number })[] = [];
  raw.moves.forEach((value, index) => {
    const m = check(portableMoveSchema, value, "moves", index);
    claim("moves", m?.key ?? rawKey(value, "input"), index);
    if (!m) return;
    moves.push({ ...m, index });
    if (m.stance !== null && !stanceAt.has(m.stance)) {
      report(locate("moves", index, ["stance"]), `no stance has the key "${m.stance}"`);
    }
    const range = options.range ? rangeProblem(m.range, options.range) : null;
    if (range !== null) report(locate("moves", index, ["range"]), range);
  });

  const edges: (PortableEdge & { index: number })[] = [];
  const edgeAt = new Map<string, number>();
  raw.edges.forEach((value, index) => {
    const e = check(portableEdgeSchema, value, "edges", index);
    if (!e) return;
    let ok = true;
    for (const end of ["from", "to"] as const) {
      const key = e[end];
      const want = KIND_ENDS[e.kind][end];
      const isMove = moveAt.has(key);
      const isStance = stanceAt.has(key);
      if (!isMove && !isStance) {
        report(locate("edges", index, [end]), `no ${want} has the key "${key}"`);
        ok = false;
      } else if ((want === "move") !== isMove) {
        report(locate("edges", index, [end]), `"${key}" is a ${isMove ? "move" : "stance"}, but ${SAYS[e.kind]}`);
        ok = false;
      }
    }
    const key = edgeKey(e);
    if (key.length > MAX_EDGE_KEY) {
      report(
        locate("edges", index),
        `this ${e.kind}'s key "${key}" is longer than ${MAX_EDGE_KEY} characters; use shorter move keys`,
      );
      ok = false;
    }
    const first = edgeAt.get(key);
    if (first !== undefined) {
      report(
        locate("edges", index),
        `the ${e.kind} "${key}" is listed twice (first at ${where(locate("edges", first))})`,
      );
      ok = false;
    } else edgeAt.set(key, index);
    if (ok) edges.push({ ...e, index });
  });

  for (const loop of followLoops(edges)) {
    const keys = loop.map((e) => e.from);
    report(
      locate("edges", loop[loop.length - 1]!.index),
      `these hits follow each other in a loop: ${[...keys, keys[0]].join(" → ")}; a string can only come back to a hit through a stance`,
    );
  }

  if (problems.length > 0 || info === null) return { character: null, problems };

  const strip = <T extends { index: number }>({ index: _index, ...rest }: T) => rest;
  const plainMoves = moves.map(strip);
  const character: PortableCharacter = {
    character: info,
    stances: stances.map(strip),
    moves: plainMoves,
    edges: orderEdges(plainMoves, edges.map(strip) as PortableEdge[]),
  };
  // The engine's own consistency check, which the checks above cover; kept so that what a
  // file passes is what the engine accepts, even if the two ever drift apart.
  const engine = graphIssues(toMoveGraph(character));
  if (engine.length > 0) return { character: null, problems: engine.map((i) => ({ message: i.message })) };
  return { character, problems: [] };
}

/** Loops made of follows alone, each as its edges in order (one per back edge of a depth-first walk). */
function followLoops<E extends PortableEdge & { index: number }>(edges: readonly E[]): E[][] {
  const out = new Map<string, E[]>();
  for (const e of edges) if (e.kind === "follow") out.set(e.from, [...(out.get(e.from) ?? []), e]);
  const state = new Map<string, "open" | "done">();
  const loops: E[][] = [];
  for (const start of out.keys()) {
    if (state.has(start)) continue;
    // Iterative: a long string must not exhaust the stack.
    const stack: { node: string; next: number }[] = [{ node: start, next: 0 }];
    const trail: E[] = [];
    state.set(start, "open");
    while (stack.length > 0) {
      const top = stack[stack.length - 1]!;
      const succ = out.get(top.node) ?? [];
      if (top.next >= succ.length) {
        state.set(top.node, "done");
        stack.pop();
        trail.pop();
        continue;
      }
      const e = succ[top.next++]!;
      const s = state.get(e.to);
      if (s === "open") {
        const from = trail.findIndex((t) => t.from === e.to);
        loops.push([...(from === -1 ? [] : trail.slice(from)), e]);
      } else if (s === undefined) {
        state.set(e.to, "open");
        trail.push(e);
        stack.push({ node: e.to, next: 0 });
      }
    }
  }
  return loops;
}
