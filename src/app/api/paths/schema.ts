import { z } from "zod";
import { graphSchema, optionsSchema } from "@/lib/engine";

/** The most paths one response carries; past it the answer says `truncated: true`. */
export const MAX_PATHS = 5_000;
/** A request body past this is refused with 413 before it is parsed. */
export const MAX_BODY_BYTES = 1_000_000;

export const pathsRequestSchema = z.strictObject({
  graph: graphSchema,
  root: z.string().min(1, "name the root move's id"),
  options: optionsSchema.optional(),
  limit: z.number().int().min(1).max(MAX_PATHS).optional(),
});

export type PathsRequest = z.infer<typeof pathsRequestSchema>;
