import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { Breadcrumb } from "@/components/ui/breadcrumb";
import { ShareStanceButton } from "@/components/stances/share-stance";
import { StanceSheetView } from "@/components/stances/stance-sheet-view";
import { readDistance } from "@/lib/move-list";
import { REACH_PARAM, SAFE_ONLY_PARAM } from "@/lib/stance-sheet";
import { atLeast } from "@/lib/roles";
import { decodeSegment } from "@/lib/segment";
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
  const data = await load(props);
  return { title: `${data.stance.name} · ${data.character.name} · ${data.game.name}` };
}

/** A stance's sheet: its ways in, its moves, and the grid of the two (DESIGN.md, "Stance sheet"). */
export default async function StancePage(props: Props) {
  const data = await load(props);
  const search = await props.searchParams;
  const user = await auth();
  const myTeams = user ? await listMyTeams({ userId: user.id }) : null;
  const shareTeams = myTeams?.filter((t) => atLeast(t.role, "player")).map((t) => ({ id: t.id, name: t.name }));
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
      <StanceSheetView
        data={data}
        safeOnly={search[SAFE_ONLY_PARAM] === "1"}
        reach={readDistance(search[REACH_PARAM])}
        linkToExplorer
        actions={
          shareTeams && edition.status === "published" ? (
            <ShareStanceButton
              teams={shareTeams}
              characterId={character.id}
              edition={edition.slug}
              stance={stance.key}
            />
          ) : null
        }
      />
    </div>
  );
}
