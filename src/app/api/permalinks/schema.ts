import { z } from "zod";
import { SLUG_PATTERN } from "@/lib/permalink";

/** A permalink's address in the path (DELETE); the POST body is `createPermalinkSchema` in `lib/permalink.ts`. */
export const slugParamsSchema = z.object({
  slug: z.string().regex(SLUG_PATTERN, { error: "That is not a permalink's address." }),
});
