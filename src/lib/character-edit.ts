import { z } from "zod";
import {
  edgeKey,
  portableCancelSchema,
  portableEdgeSchema,
  portableEnterSchema,
  portableFollowSchema,
  portableMoveSchema,
  validateCharacter,
  type FileProblem,
  type PortableCharacter,
  type PortableEdge,
  type ReadOptions,
} from "@/lib/character-file";

/**
 * Edits of one character as a coach makes them from the Explorer or the move list: add a move
 * (alone, as a follow-up of a move, or as a move of a stance), add a link between two existing
 * nodes (a cancel into a stance, most often), change a link, delete a move or a link. Each edit
 * is applied to the whole character in memory and the result checked by the same validator a
 * character file goes through, so what the editor accepts an import would accept, and the
 * Explorer can explore.
 */

const fields = portableMoveSchema.in;

/** A new move: a move as a file carries it; its key defaults to its input. */
export const newMoveSchema = fields;

/** How a new move hangs off the graph: after a move (a follow-up) or from a stance (a stance move). */
export const viaSchema = z.discriminatedUnion("kind", [
  portableFollowSchema.omit({ to: true }),
  portableEnterSchema.omit({ to: true }),
]);

/** Fields of a link that can change; which ones a link has depends on its kind, checked when applied. */
export const edgeChangesSchema = portableFollowSchema
  .pick({ input: true, gapOnBlock: true, comboOnHit: true, comboOnCounterHit: true })
  .extend(portableCancelSchema.pick({ onBlock: true, onHit: true, onCounterHit: true, autoGuard: true }).shape)
  .partial()
  .strict();

export type NewMove = z.input<typeof newMoveSchema>;
export type Via = z.input<typeof viaSchema>;
export type EdgeChanges = z.input<typeof edgeChangesSchema>;

export type CharacterEdit =
  | { op: "add-move"; move: NewMove; via?: Via }
  | { op: "add-edge"; edge: z.input<typeof portableEdgeSchema> }
  | { op: "change-edge"; key: string; changes: EdgeChanges }
  | { op: "delete-move"; key: string }
  | { op: "delete-edge"; key: string };

/** What goes with a move when it is deleted. */
export interface Dependents {
  /** Moves reached only through the deleted move (its follow-ups, and theirs), in list order. */
  moves: string[];
  /** Every link into or out of a deleted move, by key. */
  edges: string[];
}

/**
 * What deleting a move takes with it: every link into or out of it, and every move that could
 * only be reached through it (a follow-up with no other way in), repeated down the string. A move
 * nothing leads into stays: it is a string of its own. Stances stay.
 */
export function dependentsOf(c: PortableCharacter, key: string): Dependents {
  const gone = new Set([key]);
  const incoming = new Map<string, PortableEdge[]>();
  for (const e of c.edges) if (e.kind !== "cancel") incoming.set(e.to, [...(incoming.get(e.to) ?? []), e]);
  for (let grew = true; grew;) {
    grew = false;
    for (const m of c.moves) {
      const into = incoming.get(m.key);
      if (gone.has(m.key) || !into) continue;
      if (into.every((e) => gone.has(e.from))) {
        gone.add(m.key);
        grew = true;
      }
    }
  }
  return {
    moves: c.moves.filter((m) => m.key !== key && gone.has(m.key)).map((m) => m.key),
    edges: c.edges.filter((e) => gone.has(e.from) || gone.has(e.to)).map(edgeKey),
  };
}

export type EditResult =
  | { ok: true; character: PortableCharacter; touched: { moves: string[]; edges: string[] } }
  | { ok: false; problems: FileProblem[] };

const none = (message: string): EditResult => ({ ok: false, problems: [{ message }] });

/**
 * The character after one edit, checked whole; or what is wrong, each problem with the path of the
 * field that caused it (`move.damage`, `edge.onBlock`, `via.gapOnBlock`) so a form can show it there.
 */
export function applyEdit(c: PortableCharacter, edit: CharacterEdit, options: ReadOptions = {}): EditResult {
  const raw = {
    character: c.character,
    stances: [...c.stances],
    moves: [...c.moves] as unknown[],
    edges: [...c.edges] as unknown[],
  };
  // Where the edited item sits in the raw lists, to name its fields in problems.
  let mark: { part: "moves" | "edges"; index: number; as: string } | null = null;
  let via: { index: number } | null = null;
  let touched: { moves: string[]; edges: string[] } = { moves: [], edges: [] };

  switch (edit.op) {
    case "add-move": {
      const move = { ...edit.move, ...(edit.via?.kind === "enter" ? { stance: edit.via.from } : {}) };
      const key = typeof move.key === "string" && move.key.trim() !== "" ? move.key : move.input;
      mark = { part: "moves", index: raw.moves.length, as: "move" };
      raw.moves.push(move);
      touched = { moves: [key], edges: [] };
      if (edit.via) {
        via = { index: raw.edges.length };
        const edge = { ...edit.via, to: key };
        raw.edges.push(edge);
        if (typeof key === "string" && typeof edit.via.from === "string" && typeof edit.via.input === "string")
          touched.edges.push(edgeKey({ kind: edit.via.kind, from: edit.via.from, to: key, input: edit.via.input }));
      }
      break;
    }
    case "add-edge": {
      mark = { part: "edges", index: raw.edges.length, as: "edge" };
      raw.edges.push(edit.edge);
      const e = portableEdgeSchema.safeParse(edit.edge);
      touched = { moves: [], edges: e.success ? [edgeKey(e.data)] : [] };
      break;
    }
    case "change-edge": {
      const index = c.edges.findIndex((e) => edgeKey(e) === edit.key);
      if (index < 0) return none(`there is no link “${edit.key}”`);
      const next = { ...c.edges[index]!, ...edit.changes };
      raw.edges[index] = next;
      mark = { part: "edges", index, as: "changes" };
      const e = portableEdgeSchema.safeParse(next);
      touched = { moves: [], edges: e.success ? [edgeKey(e.data)] : [] };
      break;
    }
    case "delete-move": {
      if (!c.moves.some((m) => m.key === edit.key)) return none(`there is no move “${edit.key}”`);
      const { moves, edges } = dependentsOf(c, edit.key);
      const goneMoves = new Set([edit.key, ...moves]);
      const goneEdges = new Set(edges);
      raw.moves = c.moves.filter((m) => !goneMoves.has(m.key));
      raw.edges = c.edges.filter((e) => !goneEdges.has(edgeKey(e)));
      break;
    }
    case "delete-edge": {
      if (!c.edges.some((e) => edgeKey(e) === edit.key)) return none(`there is no link “${edit.key}”`);
      raw.edges = c.edges.filter((e) => edgeKey(e) !== edit.key);
      break;
    }
  }

  const checked = validateCharacter(
    raw,
    (part, index, field = []) => {
      if (mark && part === mark.part && index === mark.index) return { path: [mark.as, ...field].join(".") };
      if (via && part === "edges" && index === via.index) return { path: ["via", ...field].join(".") };
      const item =
        part === "moves"
          ? c.moves[index]?.key
          : part === "edges" && c.edges[index]
            ? edgeKey(c.edges[index])
            : undefined;
      return item === undefined
        ? {}
        : { path: [part === "moves" ? `move “${item}”` : `link “${item}”`, ...field].join(".") };
    },
    options,
  );
  if (checked.character === null) return { ok: false, problems: checked.problems };
  return { ok: true, character: checked.character, touched };
}
