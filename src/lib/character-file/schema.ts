import { z } from "zod";
import {
  cancelEdgeSchema,
  enterEdgeSchema,
  followEdgeSchema,
  levelSchema,
  moveNodeSchema,
  stanceNodeSchema,
  stateSchema,
} from "../engine/schema";
import type { GraphEdge, GraphNode, MoveGraph } from "../engine/types";

/**
 * A character as a file carries it: what the engine explores (built on its schemas) plus
 * what the database keeps beside it (keys, abbreviations, posture, the move-list order).
 * Every limit here is a column's size in `src/server/db/schema.ts`, so whatever a file
 * passes can be written without the database refusing it.
 */

export const CHARACTER_FORMAT = "framefork-character";
export const EDITION_FORMAT = "framefork-edition";
export const FORMAT_VERSION = 1;

/** Files larger than this are refused before they are read. */
export const MAX_FILE_BYTES = 10 * 1024 * 1024;

export const POSTURES = ["standing", "crouching", "any"] as const;
export const postureSchema = z.enum(POSTURES);

/** Frame figures a file may carry: wide enough for any real move, narrow enough to catch a slip. */
export const MAX_FRAMES = 999;
export const MAX_DAMAGE = 9999;
export const MAX_EDGE_KEY = 96;
const frames = z.number().int().min(-MAX_FRAMES).max(MAX_FRAMES);

// Control characters other than line breaks and tabs; a one-line field allows none at all.
const CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/;
const LINE_CONTROL = /[\u0000-\u001f\u007f]/;

/** Keys, names and inputs are one line and lose stray spaces at their ends (a spreadsheet adds them). */
const line = (max: number) =>
  z
    .string()
    .trim()
    .max(max)
    .refine((v) => !LINE_CONTROL.test(v), { message: "must be one line of text, without tabs or control characters" });
const text = (max: number) => line(max).min(1);
const optionalLine = (max: number) =>
  line(max)
    .nullish()
    .transform((v) => (v ? v : null));
/** Notes keep their spaces and line breaks; empty notes are no notes. */
const notes = z
  .string()
  .max(2000)
  .refine((v) => !CONTROL.test(v), { message: "must not contain control characters" })
  .nullish()
  .transform((v) => (v && v.trim() !== "" ? v : null));

/** A move or stance key: stable across Editions, so two Editions of it can be compared. */
export const keySchema = text(64).refine((k) => !k.startsWith("stance:"), {
  message: 'a key must not begin with "stance:", which names stances in the graph',
});

export const slugSchema = z
  .string()
  .trim()
  .min(1)
  .max(64)
  .regex(
    /^[a-z0-9]+(?:-[a-z0-9]+)*$/,
    "a slug is lowercase letters and digits joined by single dashes, e.g. night-owl",
  );

/** Tags and auto-guard levels are lists; in a CSV cell they are separated by `;`. */
export const tagSchema = text(40).refine((t) => !t.includes(";"), { message: "a tag must not contain ;" });

export const portableOutcomeSchema = z.union([
  frames,
  z.strictObject({ state: stateSchema, frames: frames.optional() }),
]);

export const characterInfoSchema = z.strictObject({
  slug: slugSchema,
  name: text(120),
  summary: notes,
});

export const portableStanceSchema = z.strictObject({
  key: keySchema,
  name: stanceNodeSchema.shape.name.pipe(text(120)),
  abbreviation: text(12),
  notes,
});

const uniqueLevels = z.array(levelSchema).refine((ls) => new Set(ls).size === ls.length, {
  message: "a level is listed twice",
});

export const portableMoveSchema = z
  .strictObject({
    /** Defaults to the input: in the demo data a move's key is its notation. */
    key: keySchema.optional(),
    input: moveNodeSchema.shape.input.pipe(text(64)),
    name: text(120),
    level: levelSchema,
    damage: z.number().int().min(0).max(MAX_DAMAGE),
    startup: frames
      .min(1)
      .nullish()
      .transform((v) => v ?? null),
    onBlock: portableOutcomeSchema,
    onHit: portableOutcomeSchema,
    onCounterHit: portableOutcomeSchema,
    range: optionalLine(16),
    tags: z
      .array(tagSchema)
      .max(20)
      .optional()
      .transform((t) => t ?? []),
    notes,
    fromPosture: postureSchema.optional().transform((p) => p ?? "standing"),
    /** The stance the move is done from (its key); null in neutral. */
    stance: keySchema.nullish().transform((s) => s ?? null),
  })
  .transform(({ key, ...move }) => ({ key: key ?? move.input, ...move }));

const edgeInput = (kind: "follow" | "cancel" | "enter") =>
  ({ follow: followEdgeSchema, cancel: cancelEdgeSchema, enter: enterEdgeSchema })[kind].shape.input.pipe(text(32));

export const portableFollowSchema = z.strictObject({
  kind: z.literal("follow"),
  from: keySchema,
  to: keySchema,
  input: edgeInput("follow"),
  gapOnBlock: frames,
  comboOnHit: followEdgeSchema.shape.comboOnHit,
  comboOnCounterHit: followEdgeSchema.shape.comboOnCounterHit,
});

export const portableCancelSchema = z.strictObject({
  kind: z.literal("cancel"),
  from: keySchema,
  to: keySchema,
  input: edgeInput("cancel"),
  onBlock: portableOutcomeSchema,
  onHit: portableOutcomeSchema,
  onCounterHit: portableOutcomeSchema,
  autoGuard: uniqueLevels.optional().transform((a) => a ?? []),
});

export const portableEnterSchema = z.strictObject({
  kind: z.literal("enter"),
  from: keySchema,
  to: keySchema,
  input: edgeInput("enter"),
});

export const portableEdgeSchema = z.discriminatedUnion("kind", [
  portableFollowSchema,
  portableCancelSchema,
  portableEnterSchema,
]);

export type PortableOutcome = z.output<typeof portableOutcomeSchema>;
export type CharacterInfo = z.output<typeof characterInfoSchema>;
export type PortableStance = z.output<typeof portableStanceSchema>;
export type PortableMove = z.output<typeof portableMoveSchema>;
export type PortableFollow = z.output<typeof portableFollowSchema>;
export type PortableCancel = z.output<typeof portableCancelSchema>;
export type PortableEnter = z.output<typeof portableEnterSchema>;
export type PortableEdge = z.output<typeof portableEdgeSchema>;

/**
 * One character of one Edition. The order of `moves` is the move list's order (the
 * database's `sort`); edges come grouped by move (see `orderEdges`).
 */
export interface PortableCharacter {
  character: CharacterInfo;
  stances: PortableStance[];
  moves: PortableMove[];
  edges: PortableEdge[];
}

/**
 * An edge's key, stable across Editions, by the demo seed's rule: a follow is
 * `from>to`, a cancel `from` + its input + `>stance`, an enter `stance>to`.
 */
export function edgeKey(edge: Pick<PortableEdge, "kind" | "from" | "to" | "input">): string {
  return edge.kind === "cancel" ? `${edge.from}${edge.input}>${edge.to}` : `${edge.from}>${edge.to}`;
}

/** The engine's node id of a stance; moves use their key as it is (as `getCharacterGraph` does). */
export const stanceNodeId = (key: string) => `stance:${key}`;

type MoveFields = Pick<
  PortableMove,
  | "key"
  | "input"
  | "name"
  | "level"
  | "damage"
  | "startup"
  | "onBlock"
  | "onHit"
  | "onCounterHit"
  | "range"
  | "tags"
  | "notes"
>;

/** A move as the engine's node: a move row of the database has the same fields (`key` is the node id). */
export function moveNode(m: MoveFields): GraphNode {
  return {
    id: m.key,
    kind: "move",
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
  };
}

/** The character as the engine's graph: node ids are move keys and `stance:<key>`, edge ids are edge keys. */
export function toMoveGraph(c: PortableCharacter): MoveGraph {
  const nodes: GraphNode[] = [
    ...c.moves.map(moveNode),
    ...c.stances.map((s): GraphNode => ({ id: stanceNodeId(s.key), kind: "stance", name: s.name })),
  ];
  const edges = c.edges.map((e): GraphEdge => {
    const id = edgeKey(e);
    switch (e.kind) {
      case "follow":
        return { ...e, id };
      case "cancel":
        return { ...e, id, to: stanceNodeId(e.to) };
      case "enter":
        return { ...e, id, from: stanceNodeId(e.from) };
    }
  });
  return { nodes, edges };
}

/**
 * Edges in the one order both formats give back: for each move in list order, the edges
 * into it, then the cancels out of it, each group in the order it came. A CSV lays a move's
 * edges out on and beside its row, so any order a file had cannot survive a round trip;
 * this one does.
 */
export function orderEdges(moves: readonly { key: string }[], edges: readonly PortableEdge[]): PortableEdge[] {
  const position = new Map(moves.map((m, i) => [m.key, i]));
  const slot = (e: PortableEdge) => {
    const move = e.kind === "cancel" ? e.from : e.to;
    return 2 * (position.get(move) ?? moves.length) + (e.kind === "cancel" ? 1 : 0);
  };
  return edges
    .map((e, i) => ({ e, i, s: slot(e) }))
    .sort((a, b) => a.s - b.s || a.i - b.i)
    .map((x) => x.e);
}
