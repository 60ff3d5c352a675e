import { graphSchema } from "@/lib/engine";
import { AppError } from "@/lib/errors";
import { auth } from "@/server/auth";
import { getExplorerData } from "@/server/db/queries/explorer";
import { getCharacterById } from "@/server/db/queries/games";
import { checkGameRead } from "@/server/games-access";
import { handle, parseWith } from "@/server/http";
import { graphParamsSchema, graphQuerySchema } from "./schema";

export const dynamic = "force-dynamic";

/**
 * One character's move graph in one Edition (default: the newest), in the
 * engine's JSON shape, with the game's frame rules. The demo game is public;
 * a team's game is read by its members only (others get 404, as if it did not exist).
 */
export const GET = handle(async (request: Request, ctx: RouteContext<"/api/characters/[id]/graph">) => {
  const { id } = parseWith(graphParamsSchema, await ctx.params, "path");
  const { edition } = parseWith(graphQuerySchema, Object.fromEntries(new URL(request.url).searchParams), "query");

  const noSuchCharacter = () => new AppError("not_found", `There is no character ${id}.`);
  const owner = await getCharacterById({ id });
  if (!owner) throw noSuchCharacter();
  // Another team's character answers exactly as one that does not exist.
  await checkGameRead({ game: owner.game, user: owner.game.teamId === null ? null : await auth() }).catch(
    (error: unknown) => {
      throw error instanceof AppError && error.code === "not_found" ? noSuchCharacter() : error;
    },
  );
  const found = await getExplorerData({ characterId: id, edition });
  if (!found.ok) {
    throw found.missing === "character"
      ? noSuchCharacter()
      : new AppError(
          "not_found",
          edition ? `${found.gameName} has no Edition "${edition}".` : `${found.gameName} has no Edition yet.`,
        );
  }
  // Stored data that the engine would refuse is our fault, not the caller's: handle() logs it as a 500.
  graphSchema.parse(found.data.graph);
  return Response.json(found.data);
});
