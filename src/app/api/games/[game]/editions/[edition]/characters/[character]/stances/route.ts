import { newStanceSchema } from "@/lib/authoring";
import { requireUser } from "@/server/auth";
import { createStance } from "@/server/db/queries/authoring";
import { characterOf, editionOf, loadGameForEdit } from "@/server/games-access";
import { handle, parseWith, readJson } from "@/server/http";
import { editionCharacterParamsSchema } from "../../../../../../schema";

export const dynamic = "force-dynamic";

type Ctx = RouteContext<"/api/games/[game]/editions/[edition]/characters/[character]/stances">;

/** Adds a stance to a character in a draft Edition. */
export const POST = handle(async (request: Request, ctx: Ctx) => {
  const params = parseWith(editionCharacterParamsSchema, await ctx.params, "path");
  const body = await readJson(request, newStanceSchema, { maxBytes: 8_000 });
  const user = await requireUser();
  const { game } = await loadGameForEdit({ slug: params.game, user });
  const edition = await editionOf(game.id, params.edition);
  const character = await characterOf(game.id, params.character);
  const stance = await createStance({
    teamId: game.teamId,
    gameId: game.id,
    editionId: edition.id,
    characterId: character.id,
    actorId: user.id,
    input: body,
  });
  return Response.json({ stance }, { status: 201 });
});
