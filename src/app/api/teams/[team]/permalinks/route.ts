import { requireUser } from "@/server/auth";
import { listTeamPermalinks } from "@/server/db/queries/permalinks";
import { handle, parseWith } from "@/server/http";
import { loadTeamFor } from "@/server/teams";
import { teamParamsSchema } from "../../schema";

export const dynamic = "force-dynamic";

/** The team's permalinks, newest first, with who made them: every member may see them. */
export const GET = handle(async (_request: Request, ctx: RouteContext<"/api/teams/[team]/permalinks">) => {
  const { team: slug } = parseWith(teamParamsSchema, await ctx.params, "path");
  const user = await requireUser();
  const { team } = await loadTeamFor({ slug, user, needed: "viewer" });
  return Response.json({ permalinks: await listTeamPermalinks({ teamId: team.id }) });
});
