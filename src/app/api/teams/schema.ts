import { z } from "zod";
import { ROLES } from "@/lib/roles";

/** Names are shown back as plain text; only control characters are refused. */
export const teamName = z
  .string({ error: "Give the team a name." })
  .trim()
  .min(2, "A team name needs at least 2 characters.")
  .max(120, "A team name can be at most 120 characters.")
  .refine((s) => !/[\u0000-\u001f\u007f]/.test(s), "A team name cannot contain control characters.");

export const createTeamSchema = z.object({ name: teamName }).strict();

export const teamParamsSchema = z.object({
  team: z.string().regex(/^[a-z0-9-]{1,64}$/, "A team is named by its slug (lower-case letters, digits and dashes)."),
});

export const role = z.enum(ROLES, { error: `A role is one of ${ROLES.join(", ")}.` });
