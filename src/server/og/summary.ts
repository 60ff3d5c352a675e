import "server-only";
import { BLOCK_CLASS_WORD, effectiveLaunchAt, formatOutcome, type Level } from "@/lib/engine";
import { computePaths, pathKey, reachableSubgraph } from "@/lib/explorer";
import type { SharedStanceViewDto, SharedViewDto } from "@/lib/dto";

/** What a link preview shows: the path's outline, or nothing of it for a link that is not public. */
export type PermalinkImageSummary =
  | { kind: "path"; title: string; input: string; levels: Level[]; onBlock: string; blockClass: string }
  | {
      kind: "stance";
      title: string;
      stance: string;
      waysIn: number;
      /** The way in with the best ending on block, first in the sheet's order. */
      best: { input: string; onBlock: string; blockClass: string } | null;
    }
  | { kind: "private" };

/**
 * The preview of a shared view: the selected path (the root alone when none
 * is selected, or when the options no longer reach it), computed by the
 * engine on the pinned Edition. Team-only links get the generic card, even
 * when the caller could read them: previews are fetched by other services.
 */
export function summarizeSharedView(shared: SharedViewDto): PermalinkImageSummary {
  if (shared.visibility === "link" && shared.kind === "stance") return summarizeStance(shared);
  // A board's preview is still to be drawn: the generic card for now.
  if (shared.visibility !== "link" || shared.kind !== "explorer") return { kind: "private" };
  const { view, data } = shared;
  const sub = reachableSubgraph(data.graph, view.root);
  const launchAt = effectiveLaunchAt(data.game.launchAt, view.options.fastest);
  const { paths } = computePaths(sub, view.root, { ...view.options, launchAt });
  const path = paths.find((p) => pathKey(p) === (view.path ?? "")) ?? paths.find((p) => p.edges.length === 0);
  if (!path) return { kind: "path", title: shared.title, input: view.root, levels: [], onBlock: "—", blockClass: "" };
  return {
    kind: "path",
    title: shared.title,
    input: path.input,
    levels: [...path.levels],
    onBlock: formatOutcome(path.onBlock),
    blockClass: BLOCK_CLASS_WORD[path.blockClass],
  };
}

/** A stance sheet's preview: the stance, how many ways in, and the best of them (the engine's first). */
function summarizeStance(shared: SharedStanceViewDto): PermalinkImageSummary {
  const { sheet, stance } = shared.sheet;
  const best = sheet.waysIn[0];
  return {
    kind: "stance",
    title: shared.title,
    stance: stance.name,
    waysIn: sheet.waysIn.length,
    best: best
      ? {
          input: best.input,
          onBlock: formatOutcome(best.cancelled.onBlock),
          blockClass: BLOCK_CLASS_WORD[best.cancelled.blockClass],
        }
      : null,
  };
}
