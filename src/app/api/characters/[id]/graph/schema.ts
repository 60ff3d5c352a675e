import { z } from "zod";

export const graphParamsSchema = z.object({
  id: z.coerce
    .number({ error: "a character id is a positive whole number" })
    .int("a character id is a positive whole number")
    .positive("a character id is a positive whole number"),
});

export const graphQuerySchema = z.object({
  edition: z
    .string()
    .regex(/^[a-z0-9-]{1,32}$/, "an Edition is named by its slug, e.g. 1-1")
    .optional(),
});
