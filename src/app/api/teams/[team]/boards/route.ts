import { requireUser } from "@/server/auth";
import { createBoard, listBoards } from "@/server/db/queries/boards";
import { handle, parseWith, readJson } from "@/server/http";
import { loadTeamFor } from "@/server/teams";
import { teamParamsSchema } from "../../schema";
import { BOARD_BODY_MAX_BYTES, createBoardSchema } from "./schema";

export const dynamic = "force-dynamic";

/** The team's Mix-up boards, the last saved first: any member. */
export const GET = handle(async (_request: Request, ctx: RouteContext<"/api/teams/[team]/boards">) => {
  const { team: slug } = parseWith(teamParamsSchema, await ctx.params, "path");
  const user = await requireUser();
  const { team } = await loadTeamFor({ slug, user, needed: "viewer" });
  return Response.json({ boards: await listBoards({ teamId: team.id }) });
});

/**
 * Makes a board for a character in an Edition of the demo game or of the team's own game
 * (coaches and owners); 201 with the board at version 1.
 */
export const POST = handle(async (request: Request, ctx: RouteContext<"/api/teams/[team]/boards">) => {
  const { team: slug } = parseWith(teamParamsSchema, await ctx.params, "path");
  const body = await readJson(request, createBoardSchema, { maxBytes: BOARD_BODY_MAX_BYTES });
  const user = await requireUser();
  const { team } = await loadTeamFor({ slug, user, needed: "coach" });
  const board = await createBoard({
    teamId: team.id,
    actorId: user.id,
    characterId: body.characterId,
    editionSlug: body.edition,
    opponentId: body.opponentId ?? null,
    title: body.title,
    origin: body.origin ?? null,
    document: body.document,
  });
  return Response.json({ board }, { status: 201 });
});
