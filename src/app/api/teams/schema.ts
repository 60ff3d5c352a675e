import { z } from "zod";
import { teamNameSchema } from "@/lib/names";
import { ROLES } from "@/lib/roles";

export const createTeamSchema = z.object({ name: teamNameSchema }).strict();

export const teamParamsSchema = z.object({
  team: z.string().regex(/^[a-z0-9-]{1,64}$/, "A team is named by its slug (lower-case letters, digits and dashes)."),
});

export const role = z.enum(ROLES, { error: `A role is one of ${ROLES.join(", ")}.` });
