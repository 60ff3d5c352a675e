import { z } from "zod";
import { RANGE_KINDS } from "./engine/range";
import { nameSchema } from "./names";

/**
 * What a coach types to bring a game of their own in: the game, its characters, its Editions.
 * The same schemas check the forms (react-hook-form's zod resolver) and the routes, so a form
 * never accepts what the server refuses. Move and edge fields are the engine's schemas.
 */

/** Frames are whole numbers; the ranges are wide enough for any game and narrow enough to catch a typo. */
const frames = (what: string, min: number, max: number) =>
  z.coerce
    .number({ error: `${what} must be a number of frames.` })
    .int({ error: `${what} must be a whole number of frames.` })
    .min(min, { error: `${what} must be at least ${min}.` })
    .max(max, { error: `${what} must be at most ${max}.` });

const summary = z
  .string()
  .trim()
  .max(2_000, { error: "Keep the summary under 2,000 characters." })
  .transform((s) => (s === "" ? null : s))
  .nullable()
  .optional();

export const gameNameSchema = nameSchema({
  missing: "Give the game a name.",
  min: 2,
  tooShort: "A game's name needs at least 2 characters.",
  tooLong: "A game's name can be at most 120 characters.",
  what: "A game's name",
});

export const editionNameSchema = nameSchema({
  missing: "Give the Edition a name, like the patch it is (1.04, Season 2).",
  min: 1,
  tooShort: "Give the Edition a name, like the patch it is (1.04, Season 2).",
  tooLong: "An Edition's name can be at most 120 characters.",
  what: "An Edition's name",
});

export const characterNameSchema = nameSchema({
  missing: "Give the character a name.",
  min: 1,
  tooShort: "Give the character a name.",
  tooLong: "A character's name can be at most 120 characters.",
  what: "A character's name",
});

export const newGameSchema = z
  .object({
    name: gameNameSchema,
    summary,
    fps: frames("Frames per second", 1, 240).default(60),
    fastest: frames("The opponent's fastest attack", 1, 60).default(10),
    launchAt: frames("The disadvantage from which a launch punish is assumed", 1, 120).default(15),
    /** How the game measures a move's range: free labels, or numbers in `rangeUnit`. */
    rangeKind: z.enum(RANGE_KINDS, { error: "Range is measured as labels or as numbers." }).default("label"),
    rangeUnit: z
      .string({ error: "The unit of range is text, like m." })
      .trim()
      .max(12, { error: "The unit of range can be at most 12 characters, like m or units." })
      .nullish(),
    /** The first Edition, a draft, made with the game. */
    edition: editionNameSchema.default("1.0"),
  })
  .strict()
  .superRefine((game, ctx) => {
    if (game.rangeKind === "number" && !game.rangeUnit) {
      ctx.addIssue({
        code: "custom",
        path: ["rangeUnit"],
        message: "Name the unit the game measures range in, like m: ranges are shown with it.",
      });
    }
  })
  // A unit means nothing when ranges are labels.
  .transform((game) => ({ ...game, rangeUnit: game.rangeKind === "number" ? (game.rangeUnit ?? null) : null }));
export type NewGame = z.input<typeof newGameSchema>;

export const newCharacterSchema = z.object({ name: characterNameSchema, summary }).strict();
export type NewCharacter = z.input<typeof newCharacterSchema>;

export const newEditionSchema = z
  .object({
    name: editionNameSchema,
    // Empty (a date field left blank) means today.
    releasedOn: z.iso.date({ error: "Give the release date as YYYY-MM-DD." }).or(z.literal("")).optional(),
    notes: summary,
  })
  .strict();
export type NewEdition = z.input<typeof newEditionSchema>;

/** A key stays the same across Editions, so two Editions of a move can be compared. */
export const keySchema = z
  .string({ error: "Give it a key." })
  .trim()
  .min(1, { error: "Give it a key." })
  .max(64, { error: "A key can be at most 64 characters." })
  .regex(/^[\p{L}\p{N} ,.+~:>_/()[\]-]+$/u, {
    error: "A key may hold letters, digits, spaces and , . + ~ : > _ / ( ) [ ] -.",
  });

export const newStanceSchema = z
  .object({
    key: keySchema,
    name: characterNameSchema,
    abbreviation: z
      .string()
      .trim()
      .min(1, { error: "Give the stance a short label, like drift." })
      .max(12, { error: "A stance's label can be at most 12 characters." }),
    notes: summary,
  })
  .strict();
export type NewStance = z.input<typeof newStanceSchema>;

/** A URL-safe slug from a name: lower-case letters, digits and dashes. */
export function slugify(name: string, fallback: string): string {
  return (
    name
      .normalize("NFKD")
      .replace(/[\u0300-\u036f]/g, "")
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 48) || fallback
  );
}
