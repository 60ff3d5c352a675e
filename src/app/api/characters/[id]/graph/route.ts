import { graphSchema } from "@/lib/engine";
import { AppError } from "@/lib/errors";
import { getCharacterById, listEditions } from "@/server/db/queries/games";
import { getCharacterGraph } from "@/server/db/queries/moves";
import { handle, parseWith } from "@/server/http";
import { graphParamsSchema, graphQuerySchema } from "./schema";

export const dynamic = "force-dynamic";

/**
 * One character's move graph in one Edition (default: the newest), in the
 * engine's JSON shape, with the game's frame rules. The demo game is public;
 * team-owned games get their role check here when teams exist.
 */
export const GET = handle(async (request: Request, ctx: RouteContext<"/api/characters/[id]/graph">) => {
  const { id } = parseWith(graphParamsSchema, await ctx.params, "path");
  const { edition: wanted } = parseWith(graphQuerySchema, Object.fromEntries(new URL(request.url).searchParams), "query");

  const found = await getCharacterById({ id });
  if (!found) throw new AppError("not_found", `There is no character ${id}.`);
  const editions = await listEditions({ gameId: found.game.id });
  const edition = wanted === undefined ? editions[0] : editions.find((e) => e.slug === wanted);
  if (!edition) {
    throw new AppError("not_found", wanted ? `${found.game.name} has no Edition "${wanted}".` : `${found.game.name} has no Edition yet.`);
  }

  const { graph, roots } = await getCharacterGraph({ characterId: id, editionId: edition.id });
  // Stored data that the engine would refuse is our fault, not the caller's: handle() logs it as a 500.
  const checked = graphSchema.parse(graph);

  return Response.json({
    game: { slug: found.game.slug, name: found.game.name, fps: found.game.fps, fastest: found.game.fastest, launchAt: found.game.launchAt },
    character: found.character,
    edition,
    editions,
    roots,
    graph: checked,
  });
});
