"use client";

import { ShareDialog, postPermalink, type ShareTeam } from "@/components/explorer/share-dialog";

/** Share: a permalink to this stance sheet, pinned to the Edition on screen. */
export function ShareStanceButton({
  teams,
  characterId,
  edition,
  stance,
}: {
  teams: ShareTeam[];
  characterId: number;
  edition: string;
  stance: string;
}) {
  return (
    <ShareDialog
      heading="Share this stance sheet"
      pinnedText="The link shows this sheet pinned to this Edition, so its numbers stay the same after later changes."
      teams={teams}
      make={(teamId, visibility) =>
        postPermalink({ kind: "stance", teamId, characterId, edition, view: { stance }, visibility })
      }
    />
  );
}
