import { graphSchema } from "@/lib/engine";
import { AppError } from "@/lib/errors";
import { auth } from "@/server/auth";
import { getExplorerData } from "@/server/db/queries/explorer";
import { getCharacterById } from "@/server/db/queries/games";
import { canReadGame } from "@/server/games-access";
import { handle, parseWith } from "@/server/http";
import { graphParamsSchema, graphQuerySchema } from "./schema";

export const dynamic = "force-dynamic";

/**
 * One character's move graph in one Edition (default: the newest), in the
 * engine's JSON shape, with the game's frame rules. The demo game is public;
 * a team's game is read by its members only: anyone else, signed in or not,
 * gets the very answer an unknown id gets.
 */
export const GET = handle(async (request: Request, ctx: RouteContext<"/api/characters/[id]/graph">) => {
  const { id } = parseWith(graphParamsSchema, await ctx.params, "path");
  const { edition } = parseWith(graphQuerySchema, Object.fromEntries(new URL(request.url).searchParams), "query");

  const noSuchCharacter = new AppError("not_found", `There is no character ${id}.`);
  const owner = await getCharacterById({ id });
  const readable =
    owner !== null && (await canReadGame({ game: owner.game, user: owner.game.teamId === null ? null : await auth() }));
  if (!readable) throw noSuchCharacter;
  const found = await getExplorerData({ characterId: id, edition });
  if (!found.ok) {
    throw new AppError(
      "not_found",
      found.missing === "character"
        ? noSuchCharacter.message
        : edition
          ? `${found.gameName} has no Edition "${edition}".`
          : `${found.gameName} has no Edition yet.`,
    );
  }
  // Stored data that the engine would refuse is our fault, not the caller's: handle() logs it as a 500.
  graphSchema.parse(found.data.graph);
  return Response.json(found.data);
});
