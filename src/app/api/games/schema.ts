import { z } from "zod";

const slug = (what: string) =>
  z.string().regex(/^[a-z0-9-]{1,64}$/, `${what} is named by its slug (lower-case letters, digits and dashes).`);

export const gameParamsSchema = z.object({ game: slug("A game") });
export const editionParamsSchema = gameParamsSchema.extend({ edition: slug("An Edition") });
export const characterParamsSchema = gameParamsSchema.extend({ character: slug("A character") });
export const editionCharacterParamsSchema = editionParamsSchema.extend({ character: slug("A character") });
