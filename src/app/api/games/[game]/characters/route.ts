import { newCharacterSchema } from "@/lib/authoring";
import { requireUser } from "@/server/auth";
import { createCharacter } from "@/server/db/queries/authoring";
import { loadGameForEdit } from "@/server/games-access";
import { handle, parseWith, readJson } from "@/server/http";
import { gameParamsSchema } from "../../schema";

export const dynamic = "force-dynamic";

/** A coach or owner adds a character to the team's game. */
export const POST = handle(async (request: Request, ctx: RouteContext<"/api/games/[game]/characters">) => {
  const { game: slug } = parseWith(gameParamsSchema, await ctx.params, "path");
  const body = await readJson(request, newCharacterSchema, { maxBytes: 8_000 });
  const user = await requireUser();
  const { game } = await loadGameForEdit({ slug, user });
  const character = await createCharacter({ teamId: game.teamId, gameId: game.id, actorId: user.id, input: body });
  return Response.json({ character }, { status: 201 });
});
