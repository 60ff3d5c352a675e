"use client";

import { useSearchParams } from "next/navigation";
import { useMyTeams } from "@/components/session";
import type { StanceSheetDto } from "@/lib/dto";
import { readDistance } from "@/lib/move-list";
import { readerActions } from "@/lib/reader-teams";
import { REACH_PARAM, SAFE_ONLY_PARAM } from "@/lib/stance-sheet";
import { ShareStanceButton } from "./share-stance";
import { StanceSheetView } from "./stance-sheet-view";

/** Share, for a signed-in reader with a team where they may make links, on a published Edition. */
export function ShareStance({
  data,
  teams,
}: {
  data: StanceSheetDto;
  teams: { id: number; name: string }[] | undefined;
}) {
  if (!teams || data.edition.status !== "published") return null;
  return (
    <ShareStanceButton
      teams={teams}
      characterId={data.character.id}
      edition={data.edition.slug}
      stance={data.stance.key}
    />
  );
}

/**
 * The stance sheet of a page served from the cache: its filters come from the
 * address and Share from the reader's teams, both read in the browser.
 */
export function StanceSheetFromAddress({ data }: { data: StanceSheetDto }) {
  const params = useSearchParams();
  const { share } = readerActions(useMyTeams());
  return (
    <StanceSheetView
      data={data}
      safeOnly={params.get(SAFE_ONLY_PARAM) === "1"}
      reach={readDistance(params.get(REACH_PARAM) ?? undefined)}
      linkToExplorer
      actions={<ShareStance data={data} teams={share?.teams} />}
    />
  );
}
