import type { SharedBoardViewDto } from "@/lib/dto";
import { VISIBILITY_TEXT } from "@/lib/permalink";
import { BoardEditor } from "./board-editor";

const dateFormat = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeZone: "UTC" });

/** `/s/[slug]` for a board: the board as saved, read-only, with who shared it. */
export function SharedBoard({ view: shared }: { view: SharedBoardViewDto }) {
  const visibility = VISIBILITY_TEXT[shared.visibility];
  return (
    <div className="space-y-4">
      <header className="space-y-1">
        <p className="text-sm text-ink-400">
          Permalink · Mix-up board · {shared.board.game.name} · {shared.board.character.name}
        </p>
        <p className="text-sm text-ink-300">
          Shared by {shared.creatorName ?? "a team member"} on{" "}
          <time dateTime={shared.createdAt}>{dateFormat.format(new Date(shared.createdAt))}</time> ·{" "}
          <span title={visibility.explain}>{visibility.label}</span> · read-only: it shows the board as the team last
          saved it.
        </p>
      </header>
      <BoardEditor board={shared.board} team={null} canEdit={false} />
    </div>
  );
}
