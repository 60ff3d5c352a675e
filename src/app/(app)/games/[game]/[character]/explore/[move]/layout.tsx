import { loadRootMove } from "../../../../data";
import { decodeSegment } from "@/lib/segment";

/**
 * Checks that the character has this move (in some Edition) before the page
 * streams, so an unknown move answers 404. An Edition without it is the
 * page's to explain: layouts do not see the search params.
 */
export default async function ExploreLayout({
  children,
  params,
}: LayoutProps<"/games/[game]/[character]/explore/[move]">) {
  const { game, character, move } = await params;
  await loadRootMove(game, character, decodeSegment(move));
  return children;
}
