import { z } from "zod";

/** `?preview=1` compares and writes nothing; without it the file is written. */
export const importQuerySchema = z.strictObject({
  preview: z.enum(["0", "1"], "preview is 1 (compare only) or 0 (import)").optional(),
});
