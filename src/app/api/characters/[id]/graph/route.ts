import { AppError } from "@/lib/errors";
import { auth } from "@/server/auth";
import { getExplorerData } from "@/server/db/queries/explorer";
import { getCharacterById } from "@/server/db/queries/games";
import { canReadGame } from "@/server/games-access";
import { GRAPH_CACHE, graphBody, publishedGraphBody } from "@/server/graph-bodies";
import { handle, parseWith } from "@/server/http";
import { jsonWithEtag } from "@/server/http-cache";
import { publicCharacter } from "@/server/published";
import { graphParamsSchema, graphQuerySchema } from "./schema";

export const dynamic = "force-dynamic";

/**
 * One character's move graph in one Edition (default: the newest), in the
 * engine's JSON shape, with the game's frame rules. The demo game is public;
 * a team's game is read by its members only: anyone else, signed in or not,
 * gets the very answer an unknown id gets, whatever they send in
 * If-None-Match. A public game's published Edition is answered from memory
 * (`publishedGraphBody`), reading nothing for a character seen before, and is
 * kept by the shared cache in front of Next (scripts/shared-cache.mjs).
 */
export const GET = handle(async (request: Request, ctx: RouteContext<"/api/characters/[id]/graph">) => {
  const { id } = parseWith(graphParamsSchema, await ctx.params, "path");
  const { edition } = parseWith(graphQuerySchema, Object.fromEntries(new URL(request.url).searchParams), "query");
  const publicAnswer = {
    "cache-control": edition === undefined ? GRAPH_CACHE.publicNewest : GRAPH_CACHE.publicEdition,
  };

  const noSuchCharacter = new AppError("not_found", `There is no character ${id}.`);
  // A public game's character seen before: nothing to read, no one to check.
  let known = await publicCharacter(id);
  let teamGame = false;
  if (!known) {
    const owner = await getCharacterById({ id });
    const readable =
      owner !== null &&
      (await canReadGame({ game: owner.game, user: owner.game.teamId === null ? null : await auth() }));
    if (!readable) throw noSuchCharacter;
    teamGame = owner.game.teamId !== null;
    if (!teamGame) known = await publicCharacter(id, owner.game.slug);
  }
  const kept = known && (await publishedGraphBody(known, edition));
  if (kept) return jsonWithEtag(request, kept, publicAnswer);

  // A team's game, a draft, or an Edition the game does not have: read for this request only.
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
  const published = found.data.edition.status === "published";
  let headers: Record<string, string> = published ? publicAnswer : { "cache-control": GRAPH_CACHE.draft };
  if (teamGame)
    headers = { "cache-control": published ? GRAPH_CACHE.teamPublished : GRAPH_CACHE.draft, vary: "Cookie" };
  return jsonWithEtag(request, graphBody(found.data), headers);
});
