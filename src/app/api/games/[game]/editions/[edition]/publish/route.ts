import { requireUser } from "@/server/auth";
import { publishEdition } from "@/server/db/queries/authoring";
import { editionOf, loadGameForEdit } from "@/server/games-access";
import { handle, parseWith } from "@/server/http";
import { editionParamsSchema } from "../../../../schema";

export const dynamic = "force-dynamic";

/** Publishes a draft Edition: from then on nothing in it changes, and links can pin it. */
export const POST = handle(
  async (_request: Request, ctx: RouteContext<"/api/games/[game]/editions/[edition]/publish">) => {
    const params = parseWith(editionParamsSchema, await ctx.params, "path");
    const user = await requireUser();
    const { game } = await loadGameForEdit({ slug: params.game, user });
    const { id } = await editionOf(game.id, params.edition);
    const edition = await publishEdition({ teamId: game.teamId, gameId: game.id, editionId: id, actorId: user.id });
    return Response.json({ edition });
  },
);
