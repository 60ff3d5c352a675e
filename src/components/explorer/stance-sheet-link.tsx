import Link from "next/link";
import type { MoveGraph, PathResult } from "@/lib/engine";
import type { GraphResponse } from "@/lib/explorer";
import { stanceSheetHref } from "@/lib/permalink";
import { stanceKeyOf } from "@/lib/stance-sheet";

/** Under the Path card, when the selected path ends in a stance: that stance's sheet, same Edition. */
export function StanceSheetLink({
  path,
  graph,
  data,
}: {
  path: PathResult;
  graph: MoveGraph;
  data: Pick<GraphResponse, "game" | "character" | "edition">;
}) {
  if (path.endsIn !== "stance") return null;
  const end = path.nodes[path.nodes.length - 1]!;
  const key = stanceKeyOf(end);
  const node = graph.nodes.find((n) => n.id === end);
  if (key === null || node?.kind !== "stance") return null;
  return (
    <p className="text-sm" data-testid="stance-sheet-link">
      <Link
        href={stanceSheetHref({
          gameSlug: data.game.slug,
          characterSlug: data.character.slug,
          edition: data.edition.slug,
          stance: key,
        })}
      >
        Every way into {node.name} and what follows it →
      </Link>
    </p>
  );
}
