import type { Metadata } from "next";
import Link from "next/link";
import { Suspense } from "react";
import { Breadcrumb } from "@/components/ui/breadcrumb";
import { ShareStance, StanceSheetFromAddress } from "@/components/stances/stance-sheet-from-address";
import { StanceSheetView } from "@/components/stances/stance-sheet-view";
import type { StanceSheetDto } from "@/lib/dto";

export function stanceTitle(data: StanceSheetDto): Metadata {
  return { title: `${data.stance.name} · ${data.character.name} · ${data.game.name}` };
}

/**
 * A stance's sheet: its ways in, its moves, and the grid of the two (DESIGN.md,
 * "Stance sheet"). `live` is what the live route read for this request (the
 * address's filters, the teams the reader may share with); without it the
 * page is the cached copy of a published Edition, which reads both in the browser.
 */
export function StancePage({
  data,
  live,
}: {
  data: StanceSheetDto;
  live?: { safeOnly: boolean; reach: number | null; shareTeams: { id: number; name: string }[] | undefined };
}) {
  const { game, character, edition, stance, sheet } = data;
  const moveList = `/games/${game.slug}/${character.slug}?edition=${edition.slug}`;
  return (
    <div className="space-y-6">
      <Breadcrumb
        trail={[
          { href: "/games", label: "Games" },
          { href: `/games/${game.slug}`, label: game.name },
          { href: moveList, label: character.name },
        ]}
      />
      <header className="space-y-1">
        <h1 className="text-2xl font-semibold">
          {stance.name} <span className="text-base font-normal text-ink-300">· {character.name}’s stance</span>
        </h1>
        <p className="text-sm text-ink-400">
          {edition.name} · {sheet.waysIn.length} {sheet.waysIn.length === 1 ? "way" : "ways"} in · {sheet.moves.length}{" "}
          {sheet.moves.length === 1 ? "move" : "moves"} from it · against a fastest attack of {game.fastest}f
        </p>
        <p className="text-sm">
          <Link href={`${moveList}#stance-${encodeURIComponent(stance.key)}`}>Back to the move list</Link>
        </p>
      </header>
      {live ? (
        <StanceSheetView
          data={data}
          safeOnly={live.safeOnly}
          reach={live.reach}
          linkToExplorer
          actions={<ShareStance data={data} teams={live.shareTeams} />}
        />
      ) : (
        // Rendered without the address's filters; the browser applies them once it runs.
        <Suspense fallback={<StanceSheetView data={data} safeOnly={false} reach={null} linkToExplorer ready={false} />}>
          <StanceSheetFromAddress data={data} />
        </Suspense>
      )}
    </div>
  );
}
