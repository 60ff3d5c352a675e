import "server-only";
import type { GraphResponse } from "@/lib/explorer";
import { getCharacterById, listCharacters, listEditions, rangeScaleOf } from "./games";
import { getCharacterGraph } from "./moves";

export type ExplorerData =
  | { ok: true; data: GraphResponse }
  | { ok: false; missing: "character" }
  | { ok: false; missing: "edition"; gameName: string };

/**
 * Everything the Explorer reads for one character in one Edition (default:
 * the newest): the graph, the moves that start something, the cast to pick
 * an opponent from, and the game's frame rules. The page and the graph route
 * both answer with this.
 */
export async function getExplorerData({
  characterId,
  edition,
}: {
  characterId: number;
  edition?: string;
}): Promise<ExplorerData> {
  const found = await getCharacterById({ id: characterId });
  if (!found) return { ok: false, missing: "character" };
  const [editions, cast] = await Promise.all([
    listEditions({ gameId: found.game.id }),
    listCharacters({ gameId: found.game.id }),
  ]);
  const chosen = edition === undefined ? editions[0] : editions.find((e) => e.slug === edition);
  if (!chosen) return { ok: false, missing: "edition", gameName: found.game.name };
  const { graph, roots, starters } = await getCharacterGraph({ characterId, editionId: chosen.id });
  const { game, character } = found;
  return {
    ok: true,
    data: {
      game: {
        slug: game.slug,
        name: game.name,
        fps: game.fps,
        fastest: game.fastest,
        launchAt: game.launchAt,
        range: rangeScaleOf(game),
      },
      character: { id: character.id, slug: character.slug, name: character.name },
      edition: chosen,
      editions,
      roots,
      starters,
      cast: cast.map((c) => ({ id: c.id, slug: c.slug, name: c.name })),
      graph,
    },
  };
}
