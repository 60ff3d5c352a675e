import { z } from "zod";
import { AppError } from "@/lib/errors";
import { requireUser } from "@/server/auth";
import { atLeast } from "@/server/authz";
import { changeRole, removeMember } from "@/server/db/queries/teams";
import { handle, parseWith, readJson } from "@/server/http";
import { loadTeamFor } from "@/server/teams";
import { role, teamParamsSchema } from "../../../schema";

export const dynamic = "force-dynamic";

const paramsSchema = teamParamsSchema.extend({ user: z.string().min(1).max(255) });
const changeSchema = z.object({ role }).strict();

/** An owner changes a member's role. */
export const PATCH = handle(async (request: Request, ctx: RouteContext<"/api/teams/[team]/members/[user]">) => {
  const { team: slug, user: userId } = parseWith(paramsSchema, await ctx.params, "path");
  const body = await readJson(request, changeSchema, { maxBytes: 1_000 });
  const user = await requireUser();
  const { team } = await loadTeamFor({ slug, user, needed: "owner" });
  const member = await changeRole({ teamId: team.id, actorId: user.id, userId, role: body.role });
  return Response.json({ member });
});

/** An owner removes a member; any member may remove themselves (leave). */
export const DELETE = handle(async (_request: Request, ctx: RouteContext<"/api/teams/[team]/members/[user]">) => {
  const { team: slug, user: userId } = parseWith(paramsSchema, await ctx.params, "path");
  const user = await requireUser();
  const { team, role: mine } = await loadTeamFor({ slug, user, needed: "viewer" });
  if (userId !== user.id && !atLeast(mine, "owner"))
    throw new AppError("forbidden", "Only an owner can remove other members.");
  await removeMember({ teamId: team.id, actorId: user.id, userId });
  return new Response(null, { status: 204 });
});
