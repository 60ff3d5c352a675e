import { exportCharacterCsv, exportCharacterJson } from "@/lib/character-file";
import { AppError } from "@/lib/errors";
import { loadPortableCharacter } from "@/server/db/queries/character-io";
import { characterOf, editionOf, loadGameForRead } from "@/server/games-access";
import { exportFormat, fileResponse, handle, parseWith } from "@/server/http";
import { editionCharacterParamsSchema } from "../../../../../../schema";

export const dynamic = "force-dynamic";

type Ctx = RouteContext<"/api/games/[game]/editions/[edition]/characters/[character]/export">;

/** One character of one Edition as a CSV or JSON file, for anyone who may read the game. */
export const GET = handle(async (request: Request, ctx: Ctx) => {
  const params = parseWith(editionCharacterParamsSchema, await ctx.params, "path");
  const format = exportFormat(request);
  const game = await loadGameForRead({ slug: params.game });
  const edition = await editionOf(game.id, params.edition);
  const character = await characterOf(game.id, params.character);
  const data = await loadPortableCharacter({ editionId: edition.id, characterId: character.id });
  if (!data) throw new AppError("not_found", "No such character in this game.");
  return fileResponse({
    text: format === "csv" ? exportCharacterCsv(data) : exportCharacterJson(data),
    format,
    name: `${game.slug}-${edition.slug}-${character.slug}`,
    isPublic: game.teamId === null,
  });
});
