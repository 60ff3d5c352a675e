import { newGameSchema } from "@/lib/authoring";
import { requireUser } from "@/server/auth";
import { createGame } from "@/server/db/queries/authoring";
import { handle, parseWith, readJson } from "@/server/http";
import { loadTeamFor } from "@/server/teams";
import { teamParamsSchema } from "../../schema";

export const dynamic = "force-dynamic";

/** A coach or owner makes a game for the team, with its first Edition as a draft. */
export const POST = handle(async (request: Request, ctx: RouteContext<"/api/teams/[team]/games">) => {
  const { team: slug } = parseWith(teamParamsSchema, await ctx.params, "path");
  const body = await readJson(request, newGameSchema, { maxBytes: 8_000 });
  const user = await requireUser();
  const { team } = await loadTeamFor({ slug, user, needed: "coach" });
  const made = await createGame({ teamId: team.id, actorId: user.id, input: body });
  return Response.json(made, { status: 201 });
});
