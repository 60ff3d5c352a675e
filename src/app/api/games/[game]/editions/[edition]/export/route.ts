import { exportEditionCsv, exportEditionJson } from "@/lib/character-file";
import { loadPortableEdition } from "@/server/db/queries/character-io";
import { editionOf, loadGameForRead } from "@/server/games-access";
import { exportFormat, fileResponse, handle, parseWith } from "@/server/http";
import { editionParamsSchema } from "../../../../schema";

export const dynamic = "force-dynamic";

/** A whole Edition (every character with frame data in it) as one CSV or JSON file, for anyone who may read the game. */
export const GET = handle(
  async (request: Request, ctx: RouteContext<"/api/games/[game]/editions/[edition]/export">) => {
    const params = parseWith(editionParamsSchema, await ctx.params, "path");
    const format = exportFormat(request);
    const game = await loadGameForRead({ slug: params.game });
    const edition = await editionOf(game.id, params.edition);
    const list = await loadPortableEdition({ gameId: game.id, editionId: edition.id });
    return fileResponse({
      text: format === "csv" ? exportEditionCsv(list) : exportEditionJson(list),
      format,
      name: `${game.slug}-${edition.slug}`,
      isPublic: game.teamId === null,
    });
  },
);
