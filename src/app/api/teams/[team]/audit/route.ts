import { requireUser } from "@/server/auth";
import { listAudit } from "@/server/db/queries/audit";
import { handle, parseWith } from "@/server/http";
import { loadTeamFor } from "@/server/teams";
import { teamParamsSchema } from "../../schema";

export const dynamic = "force-dynamic";

/** Who changed what in the team: for the people who manage it (coach and owner). */
export const GET = handle(async (_request: Request, ctx: RouteContext<"/api/teams/[team]/audit">) => {
  const { team: slug } = parseWith(teamParamsSchema, await ctx.params, "path");
  const user = await requireUser();
  const { team } = await loadTeamFor({ slug, user, needed: "coach" });
  return Response.json({ entries: await listAudit({ teamId: team.id }) });
});
