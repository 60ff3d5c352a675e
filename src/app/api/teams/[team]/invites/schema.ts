import { z } from "zod";
import { role } from "../../schema";

export const inviteSchema = z
  .object({
    email: z.email({ error: "Give the e-mail address to invite, like name@example.com." }).max(255),
    role,
  })
  .strict();
