import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { StancePage, stanceTitle } from "@/app/_shared/stance-page";
import { readDistance } from "@/lib/move-list";
import { readerActions } from "@/lib/reader-teams";
import { decodeSegment } from "@/lib/segment";
import { REACH_PARAM, SAFE_ONLY_PARAM } from "@/lib/stance-sheet";
import { auth } from "@/server/auth";
import { listMyTeams } from "@/server/db/queries/teams";
import { getStanceSheet } from "@/server/db/queries/stance-sheets";
import { loadCharacter } from "../../../../data";

type Props = PageProps<"/games/[game]/[character]/stances/[stance]">;

/** The sheet, or the app's not-found for an unknown Edition or stance (the game's team check is loadCharacter's). */
async function load(props: Props) {
  const slugs = await props.params;
  const { character } = await loadCharacter(slugs.game, slugs.character);
  const wanted = (await props.searchParams).edition;
  if (wanted !== undefined && typeof wanted !== "string") notFound();
  const found = await getStanceSheet({
    characterId: character.id,
    edition: wanted,
    stanceKey: decodeSegment(slugs.stance),
  });
  if (!found.ok) notFound();
  return found.data;
}

export async function generateMetadata(props: Props): Promise<Metadata> {
  return stanceTitle(await load(props));
}

/**
 * A stance's sheet, rendered for each request: a team's game, a draft, or an
 * address the proxy does not send to the cached copy (src/server/published.ts).
 */
export default async function LiveStancePage(props: Props) {
  const data = await load(props);
  const search = await props.searchParams;
  const user = await auth();
  const { share } = readerActions(user ? await listMyTeams({ userId: user.id }) : null);
  return (
    <StancePage
      data={data}
      live={{
        safeOnly: search[SAFE_ONLY_PARAM] === "1",
        reach: readDistance(search[REACH_PARAM]),
        shareTeams: share?.teams,
      }}
    />
  );
}
