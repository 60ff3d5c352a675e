import { z } from "zod";
import { STATES } from "@/lib/engine/schema";
import { cellPayoff, type Board, type CellBasis, type ValueTable } from "@/lib/engine";

/**
 * A Mix-up board as it is saved: situations whose cells either keep the engine's basis
 * (valued through the board's value table) or a number the coach typed (`override`), and may
 * lead to a child situation. The engine's `boardToSolve` turns it into the solver's `Board`.
 */

export const BOARD_LIMITS = {
  options: 12,
  situations: 200,
  name: 80,
  label: 40,
  note: 4000,
  title: 120,
  /** Any payoff or value-table entry, in damage points: generous, but a typo of 1e9 is refused. */
  magnitude: 100_000,
} as const;

const text = (what: string, max: number) =>
  z
    .string({ error: `${what} must be text.` })
    .trim()
    .max(max, { error: `${what} is longer than ${max} characters.` })
    .regex(/^[^\u0000-\u0008\u000b-\u001f\u007f]*$/, { error: `${what} may not contain control characters.` });

const label = (what: string) => text(what, BOARD_LIMITS.label).min(1, { error: `${what} needs a name.` });

export const payoffSchema = (what: string) =>
  z
    .number({ error: `${what} must be a number.` })
    .finite({ error: `${what} must be a finite number.` })
    .min(-BOARD_LIMITS.magnitude, { error: `${what} must be at least -${BOARD_LIMITS.magnitude}.` })
    .max(BOARD_LIMITS.magnitude, { error: `${what} must be at most ${BOARD_LIMITS.magnitude}.` });

export const situationIdSchema = z
  .string({ error: "A situation id must be text." })
  .regex(/^[a-z0-9-]{1,24}$/, { error: "A situation id is 1 to 24 lowercase letters, digits or dashes." });

const frames = z.number().int().min(-999).max(999);
const outcomeSchema = z.union([frames, z.object({ state: z.enum(STATES), frames: frames.optional() }).strict()]);
const boardMoveSchema = z
  .object({ input: text("A move's input", 64), damage: payoffSchema("Damage"), startup: frames })
  .strict();

export const cellBasisSchema: z.ZodType<CellBasis> = z.discriminatedUnion("kind", [
  z
    .object({
      kind: z.literal("blocked"),
      input: text("The input", 200),
      onBlock: outcomeSchema,
      defenderStance: z.enum(["standing", "crouching"]),
      punisher: boardMoveSchema.nullable(),
    })
    .strict(),
  z
    .object({
      kind: z.literal("hit"),
      input: text("The input", 200),
      damage: payoffSchema("Damage"),
      outcome: outcomeSchema,
      counterHit: z.boolean(),
    })
    .strict(),
  z.object({ kind: z.literal("whiff"), input: text("The input", 200) }).strict(),
  z
    .object({
      kind: z.literal("interrupted"),
      input: text("The input", 200),
      gap: frames,
      interrupt: boardMoveSchema,
    })
    .strict(),
]);

export const valueTableSchema: z.ZodType<ValueTable> = z
  .object({
    plusFrame: payoffSchema("The value of a frame ahead"),
    minusFrame: payoffSchema("The cost of a frame behind"),
    states: z
      .object(
        Object.fromEntries(STATES.map((s) => [s, payoffSchema(`The value of ${s}`)])) as Record<
          (typeof STATES)[number],
          ReturnType<typeof payoffSchema>
        >,
      )
      .strict(),
    whiff: payoffSchema("The cost of a whiff"),
  })
  .strict();

export const boardCellSchema = z
  .object({
    /** The engine's facts when the cell was filled from a path; null for a cell typed by hand. */
    basis: cellBasisSchema.nullable(),
    /** The coach's number, used instead of the basis's value; null: the basis's value (or 0). */
    override: payoffSchema("A cell").nullable(),
    /** The child situation whose solved value is added to the cell. */
    next: situationIdSchema.nullable(),
  })
  .strict();

export const boardSituationDocSchema = z
  .object({
    id: situationIdSchema,
    name: text("A situation's name", BOARD_LIMITS.name).min(1, { error: "A situation needs a name." }),
    note: text("A note", BOARD_LIMITS.note),
    rows: z
      .array(label("An attacker option"))
      .min(1, { error: "A situation needs at least one attacker option." })
      .max(BOARD_LIMITS.options, { error: `A situation has at most ${BOARD_LIMITS.options} attacker options.` }),
    cols: z
      .array(label("A defender option"))
      .min(1, { error: "A situation needs at least one defender option." })
      .max(BOARD_LIMITS.options, { error: `A situation has at most ${BOARD_LIMITS.options} defender options.` }),
    cells: z.array(z.array(boardCellSchema).max(BOARD_LIMITS.options)).max(BOARD_LIMITS.options),
  })
  .strict()
  .superRefine((s, ctx) => {
    const ragged = s.cells.length !== s.rows.length || s.cells.some((r) => r.length !== s.cols.length);
    if (ragged) {
      ctx.addIssue({
        code: "custom",
        path: ["cells"],
        message: `Situation "${s.id}" needs ${s.rows.length} x ${s.cols.length} cells, one per attacker and defender option.`,
      });
    }
  });

export const boardDocumentSchema = z
  .object({
    root: situationIdSchema,
    values: valueTableSchema,
    situations: z
      .array(boardSituationDocSchema)
      .min(1, { error: "A board needs at least one situation." })
      .max(BOARD_LIMITS.situations, { error: `A board has at most ${BOARD_LIMITS.situations} situations.` }),
  })
  .strict();

export type BoardCell = z.infer<typeof boardCellSchema>;
export type BoardSituationDoc = z.infer<typeof boardSituationDocSchema>;
export type BoardDocument = z.infer<typeof boardDocumentSchema>;

/**
 * The references inside a document that its shape alone cannot check: situation ids are unique,
 * and the root and every cell's `next` name a situation of the board. Each issue names the id.
 * Cycles are the engine's to find (`solveBoard` throws `BoardInputError`), not this check's.
 */
export function boardReferenceIssues(doc: BoardDocument): { path: (string | number)[]; message: string }[] {
  const issues: { path: (string | number)[]; message: string }[] = [];
  const ids = new Set<string>();
  doc.situations.forEach((s, i) => {
    if (ids.has(s.id))
      issues.push({
        path: ["situations", i, "id"],
        message: `Two situations have the id "${s.id}"; give each its own.`,
      });
    ids.add(s.id);
  });
  if (!ids.has(doc.root))
    issues.push({ path: ["root"], message: `The board starts at "${doc.root}", which is not one of its situations.` });
  doc.situations.forEach((s, i) =>
    s.cells.forEach((row, r) =>
      row.forEach((cell, c) => {
        if (cell.next !== null && !ids.has(cell.next))
          issues.push({
            path: ["situations", i, "cells", r, c, "next"],
            message: `A cell of "${s.id}" leads to "${cell.next}", which is not one of the board's situations.`,
          });
      }),
    ),
  );
  return issues;
}

/** A document as it is saved: its shape, then its references (`boardReferenceIssues`). */
export const savedBoardDocumentSchema = boardDocumentSchema.superRefine((doc, ctx) => {
  for (const issue of boardReferenceIssues(doc)) ctx.addIssue({ code: "custom", ...issue });
});

export const boardTitleSchema = text("A board's title", BOARD_LIMITS.title)
  .min(1, { error: "Give the board a title." })
  .regex(/^[^\n\t]*$/, { error: "A board's title is one line." });

/** Where in the Explorer a board was made: the root move's key and the selected path's key (null: the root alone). */
export const boardOriginSchema = z
  .object({
    root: text("The root move", 64).min(1, { error: "Name the move the board was made from." }),
    path: text("The path", 4000).nullable(),
  })
  .strict();
export type BoardOrigin = z.infer<typeof boardOriginSchema>;

/** Whether the coach typed this cell's number instead of the basis's value. */
export function cellIsOverridden(cell: BoardCell): boolean {
  return cell.override !== null;
}

/**
 * The solver's board of a saved document: each cell's payoff is the coach's override, else
 * its basis valued through the board's value table, else 0; its next link as saved.
 */
export function boardToSolve(doc: BoardDocument): Board {
  return {
    root: doc.root,
    situations: doc.situations.map((s) => ({
      id: s.id,
      name: s.name,
      rows: s.rows,
      cols: s.cols,
      payoffs: s.cells.map((row) =>
        row.map((cell) => cell.override ?? (cell.basis === null ? 0 : cellPayoff(cell.basis, doc.values))),
      ),
      next: s.cells.map((row) => row.map((cell) => cell.next)),
    })),
  };
}

/** A situation id not yet in the document: "s" and one more than the highest such number in use ("s2" after "s1"). */
export function newSituationId(doc: Pick<BoardDocument, "situations">): string {
  let highest = 0;
  for (const s of doc.situations) {
    const m = /^s(\d+)$/.exec(s.id);
    if (m !== null) highest = Math.max(highest, Number(m[1]));
  }
  if (Number.isSafeInteger(highest + 1)) return `s${highest + 1}`;
  // An id such as "s99999999999999999999" leaves no next number: take the lowest free one.
  const used = new Set(doc.situations.map((s) => s.id));
  let n = 1;
  while (used.has(`s${n}`)) n++;
  return `s${n}`;
}
