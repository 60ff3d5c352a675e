import { requireUser } from "@/server/auth";
import { listMembers } from "@/server/db/queries/teams";
import { handle, parseWith } from "@/server/http";
import { loadTeamFor } from "@/server/teams";
import { teamParamsSchema } from "../../schema";

export const dynamic = "force-dynamic";

/** The team's members and their roles: every member may see them. */
export const GET = handle(async (_request: Request, ctx: RouteContext<"/api/teams/[team]/members">) => {
  const { team: slug } = parseWith(teamParamsSchema, await ctx.params, "path");
  const user = await requireUser();
  const { team } = await loadTeamFor({ slug, user, needed: "viewer" });
  return Response.json({ members: await listMembers({ teamId: team.id }) });
});
