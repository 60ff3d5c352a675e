"use client";

import { ShareDialog, postPermalink } from "@/components/explorer/share-dialog";
import type { SharedBoardDto } from "@/lib/dto";

/** Share a board: a Permalink that opens it read-only, pinned to the Edition it was made on. */
export function BoardShareButton({ board, teamId }: { board: SharedBoardDto; teamId: number }) {
  return (
    <ShareDialog
      heading="Share this board"
      pinnedText={`The link opens the board as it is saved, read-only, with the numbers of Edition ${board.edition.name}.`}
      teams={null}
      make={(_teamId, visibility) => postPermalink({ kind: "board", teamId, view: { board: board.id }, visibility })}
    />
  );
}
