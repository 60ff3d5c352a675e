import { z } from "zod";
import { requireUser } from "@/server/auth";
import { revokeInvite } from "@/server/db/queries/invites";
import { handle, parseWith } from "@/server/http";
import { loadTeamFor } from "@/server/teams";
import { teamParamsSchema } from "../../../schema";

export const dynamic = "force-dynamic";

const paramsSchema = teamParamsSchema.extend({
  invite: z.coerce.number().int().positive("An invite is named by its number."),
});

/** Withdraws an invite that has not been accepted. */
export const DELETE = handle(async (_request: Request, ctx: RouteContext<"/api/teams/[team]/invites/[invite]">) => {
  const { team: slug, invite } = parseWith(paramsSchema, await ctx.params, "path");
  const user = await requireUser();
  const { team } = await loadTeamFor({ slug, user, needed: "coach" });
  await revokeInvite({ teamId: team.id, inviteId: invite, actorId: user.id });
  return new Response(null, { status: 204 });
});
