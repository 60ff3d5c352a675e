import { z } from "zod";

/** Hit levels, as the trade names them (DESIGN.md, "Words"). */
export const levelSchema = z.enum(["high", "mid", "low", "special-mid", "throw", "unblockable"]);
export type Level = z.infer<typeof levelSchema>;

export const outcomeStateSchema = z.enum(["knockdown", "launch", "wall-splat", "crumple", "throw"]);
export type OutcomeState = z.infer<typeof outcomeStateSchema>;

/** Frame advantage after an exchange, or a state that may carry a number too. */
export const outcomeSchema = z.union([
  z.number().int().min(-99).max(99),
  z.strictObject({ state: outcomeStateSchema, frames: z.number().int().min(-99).max(199).optional() }),
]);
export type Outcome = z.infer<typeof outcomeSchema>;
