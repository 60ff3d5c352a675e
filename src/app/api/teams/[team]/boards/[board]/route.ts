import { requireUser } from "@/server/auth";
import { deleteBoard, getBoard, saveBoard } from "@/server/db/queries/boards";
import { handle, parseWith, readJson } from "@/server/http";
import { loadTeamFor } from "@/server/teams";
import { versionQuerySchema } from "../../../../games/schema";
import { boardParamsSchema, BOARD_BODY_MAX_BYTES, saveBoardSchema } from "../schema";

export const dynamic = "force-dynamic";

type Ctx = RouteContext<"/api/teams/[team]/boards/[board]">;

/** One board of the team, as its editor opens it: any member. */
export const GET = handle(async (_request: Request, ctx: Ctx) => {
  const { team: slug, board } = parseWith(boardParamsSchema, await ctx.params, "path");
  const user = await requireUser();
  const { team } = await loadTeamFor({ slug, user, needed: "viewer" });
  return Response.json({ board: await getBoard({ teamId: team.id, boardId: board }) });
});

/**
 * Saves a board's title and document (coaches and owners), based on the version the editor
 * read: the board at the next version, or 409 with the board as it is now (`current`).
 */
export const PUT = handle(async (request: Request, ctx: Ctx) => {
  const { team: slug, board } = parseWith(boardParamsSchema, await ctx.params, "path");
  const body = await readJson(request, saveBoardSchema, { maxBytes: BOARD_BODY_MAX_BYTES });
  const user = await requireUser();
  const { team } = await loadTeamFor({ slug, user, needed: "coach" });
  const saved = await saveBoard({
    teamId: team.id,
    boardId: board,
    actorId: user.id,
    version: body.version,
    title: body.title,
    document: body.document,
  });
  return Response.json({ board: saved });
});

/** Deletes a board (`?version=N`, the version the editor read; coaches and owners); 204. */
export const DELETE = handle(async (request: Request, ctx: Ctx) => {
  const { team: slug, board } = parseWith(boardParamsSchema, await ctx.params, "path");
  const { version } = parseWith(versionQuerySchema, Object.fromEntries(new URL(request.url).searchParams), "query");
  const user = await requireUser();
  const { team } = await loadTeamFor({ slug, user, needed: "coach" });
  await deleteBoard({ teamId: team.id, boardId: board, actorId: user.id, version });
  return new Response(null, { status: 204 });
});
