import type { SharedStanceViewDto } from "@/lib/dto";
import { VISIBILITY_TEXT } from "@/lib/permalink";
import { StanceSheetView } from "./stance-sheet-view";

const dateFormat = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeZone: "UTC" });

/** `/s/[slug]` for a stance sheet: the sheet in its pinned Edition, with who shared it. */
export function SharedStance({ view: shared, safeOnly }: { view: SharedStanceViewDto; safeOnly: boolean }) {
  const visibility = VISIBILITY_TEXT[shared.visibility];
  const { sheet: data } = shared;
  return (
    <div className="space-y-6">
      <header className="space-y-1">
        <p className="text-sm text-ink-400">
          Permalink · {shared.title} · {data.game.name} · pinned to {data.edition.name}
        </p>
        <h1 className="text-2xl font-semibold">
          {data.stance.name}{" "}
          <span className="text-base font-normal text-ink-300">· {data.character.name}’s stance</span>
        </h1>
        <p className="text-sm text-ink-300">
          Shared by {shared.creatorName ?? "a team member"} on{" "}
          <time dateTime={shared.createdAt}>{dateFormat.format(new Date(shared.createdAt))}</time> ·{" "}
          <span title={visibility.explain}>{visibility.label}</span>
        </p>
      </header>
      <StanceSheetView data={data} safeOnly={safeOnly} linkToExplorer={false} />
    </div>
  );
}
