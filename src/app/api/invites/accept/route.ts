import { z } from "zod";
import { requireUser } from "@/server/auth";
import { acceptInvite } from "@/server/db/queries/invites";
import { handle, readJson } from "@/server/http";

export const dynamic = "force-dynamic";

const acceptSchema = z
  .object({ token: z.string().min(16, "That is not an invite token.").max(128, "That is not an invite token.") })
  .strict();

/** The signed-in user accepts an invite sent to their address and joins the team. */
export const POST = handle(async (request: Request) => {
  const { token } = await readJson(request, acceptSchema, { maxBytes: 1_000 });
  const user = await requireUser();
  const joined = await acceptInvite({ token, userId: user.id, userEmail: user.email });
  return Response.json({ team: joined });
});
