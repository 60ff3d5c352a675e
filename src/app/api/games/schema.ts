import { z } from "zod";
import { decodeSegment } from "@/lib/segment";

const slug = (what: string) =>
  z.string().regex(/^[a-z0-9-]{1,64}$/, `${what} is named by its slug (lower-case letters, digits and dashes).`);

export const gameParamsSchema = z.object({ game: slug("A game") });
export const editionParamsSchema = gameParamsSchema.extend({ edition: slug("An Edition") });
export const characterParamsSchema = gameParamsSchema.extend({ character: slug("A character") });
export const editionCharacterParamsSchema = editionParamsSchema.extend({ character: slug("A character") });

/** A move's or a link's key as a path segment: sent percent-encoded (`drift:v` → `drift%3Av`), read as it was meant. */
const keySegment = (what: string, max: number) =>
  z
    .string()
    .transform(decodeSegment)
    .pipe(z.string().min(1, `Name the ${what} by its key.`).max(max, `A ${what}'s key is at most ${max} characters.`));

export const moveParamsSchema = editionCharacterParamsSchema.extend({ move: keySegment("move", 64) });
export const edgeParamsSchema = editionCharacterParamsSchema.extend({ edge: keySegment("link", 96) });

/** `?version=N` on a delete: the version of the row the editor read. */
export const versionQuerySchema = z
  .object({
    version: z
      .string({ error: "Send the version you read it at, as ?version=N." })
      .regex(/^[1-9][0-9]{0,9}$/, "The version is a whole number from 1.")
      .transform(Number),
  })
  .strict();
