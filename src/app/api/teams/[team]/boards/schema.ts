import { z } from "zod";
import { boardOriginSchema, boardTitleSchema, savedBoardDocumentSchema } from "@/lib/board";
import { teamParamsSchema } from "../../schema";

const characterId = (what: string) =>
  z
    .number({ error: `${what} must be a character's number.` })
    .int({ error: `${what} must be a whole number.` })
    .positive({ error: `${what} must be positive.` });

/** The body of POST /api/teams/[team]/boards. */
export const createBoardSchema = z
  .object({
    characterId: characterId("The character"),
    edition: z
      .string({ error: "Say which Edition the board is for." })
      .regex(/^[a-z0-9-]{1,32}$/, { error: "An Edition is named by its slug, such as 1-1." }),
    opponentId: characterId("The opponent").nullable().optional(),
    title: boardTitleSchema,
    origin: boardOriginSchema.nullable().optional(),
    document: savedBoardDocumentSchema,
  })
  .strict();

/** The body of PUT /api/teams/[team]/boards/[board]: the version the editor read, and what it saves. */
export const saveBoardSchema = z
  .object({
    version: z
      .number({ error: "Send the version you read the board at." })
      .int({ error: "The version is a whole number." })
      .min(1, { error: "The version is a whole number from 1." }),
    title: boardTitleSchema,
    document: savedBoardDocumentSchema,
  })
  .strict();

export const boardParamsSchema = teamParamsSchema.extend({
  board: z
    .string()
    .regex(/^[1-9][0-9]{0,15}$/, "A board is named by its number.")
    .transform(Number),
});

/** A whole board is at most 200 situations of 12 x 12 cells: room for that, not for more. */
export const BOARD_BODY_MAX_BYTES = 2_000_000;
