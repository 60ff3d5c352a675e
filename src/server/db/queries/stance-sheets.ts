import "server-only";
import { stanceSheet, type MoveGraph } from "@/lib/engine";
import { stanceNodeIdOf, wayInPaths } from "@/lib/stance-sheet";
import type { StanceSheetDto } from "@/lib/dto";
import { getExplorerData } from "./explorer";

/** A move node's range as the data gives it, or null. */
function rangeOf(graph: MoveGraph, id: string): string | null {
  const node = graph.nodes.find((n) => n.id === id);
  return node?.kind === "move" && node.range !== undefined ? String(node.range) : null;
}

export type StanceSheetResult =
  { ok: true; data: StanceSheetDto } | { ok: false; missing: "character" | "edition" | "stance" };

/**
 * One stance's sheet for a character in an Edition (default: the newest), computed by the
 * engine on that Edition's graph with the game's frame rules. The caller has checked the viewer
 * may read the game.
 */
export async function getStanceSheet({
  characterId,
  edition,
  stanceKey,
}: {
  characterId: number;
  edition?: string;
  stanceKey: string;
}): Promise<StanceSheetResult> {
  const found = await getExplorerData({ characterId, edition });
  if (!found.ok) return { ok: false, missing: found.missing };
  const { graph, game, character } = found.data;
  const stance = graph.nodes.find((n) => n.id === stanceNodeIdOf(stanceKey));
  if (stance?.kind !== "stance") return { ok: false, missing: "stance" };
  const sheet = stanceSheet(graph, stance.id, { fastest: game.fastest, launchAt: game.launchAt });
  const e = found.data.edition;
  return {
    ok: true,
    data: {
      game: { slug: game.slug, name: game.name, fastest: game.fastest, launchAt: game.launchAt, range: game.range },
      character,
      edition: { slug: e.slug, name: e.name, status: e.status },
      stance: { key: stanceKey, name: stance.name },
      sheet,
      paths: wayInPaths(graph, sheet),
      ranges: Object.fromEntries(sheet.moves.map((m) => [m.move, rangeOf(graph, m.move)])),
    },
  };
}
