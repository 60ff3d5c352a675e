import { newEditionSchema } from "@/lib/authoring";
import { requireUser } from "@/server/auth";
import { startEdition } from "@/server/db/queries/authoring";
import { loadGameForEdit } from "@/server/games-access";
import { handle, parseWith, readJson } from "@/server/http";
import { gameParamsSchema } from "../../schema";

export const dynamic = "force-dynamic";

/** Starts the next Edition: a draft copy of the newest one, to enter a patch's changes in. */
export const POST = handle(async (request: Request, ctx: RouteContext<"/api/games/[game]/editions">) => {
  const { game: slug } = parseWith(gameParamsSchema, await ctx.params, "path");
  const body = await readJson(request, newEditionSchema, { maxBytes: 8_000 });
  const user = await requireUser();
  const { game } = await loadGameForEdit({ slug, user });
  const edition = await startEdition({ teamId: game.teamId, gameId: game.id, actorId: user.id, input: body });
  return Response.json({ edition }, { status: 201 });
});
