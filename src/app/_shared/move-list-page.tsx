import Link from "next/link";
import { Suspense } from "react";
import { Breadcrumb } from "@/components/ui/breadcrumb";
import type { MoveList } from "@/lib/dto";
import { rangeScaleOf, type CharacterSummary, type EditionSummary, type GameSummary } from "@/server/db/queries/games";
import { MoveTable, MoveTableView } from "@/components/moves/move-table";

/**
 * A character's move list in one Edition: the page the live route renders for
 * each request and the cached route renders once per published Edition.
 */
export function MoveListPage({
  game,
  character,
  editions,
  edition,
  list,
  edits,
  unknownEdition,
  cached = false,
}: {
  game: GameSummary;
  character: CharacterSummary;
  editions: EditionSummary[];
  edition: EditionSummary;
  list: MoveList;
  /** A coach or owner on a draft: the import link, and numbers fixed in place in the list. */
  edits: boolean;
  /** The Edition the address asked for, when there is none by that name. */
  unknownEdition?: string;
  /** Rendered once for the cache, without the address's query string (see below). */
  cached?: boolean;
}) {
  const table = {
    list,
    rules: { fastest: game.fastest, launchAt: game.launchAt },
    range: rangeScaleOf(game),
    exploreBase: `/games/${game.slug}/${character.slug}/explore`,
    stanceSheets: { gameSlug: game.slug, characterSlug: character.slug },
    edition: edition.slug,
    editBase: edits ? `/api/games/${game.slug}/editions/${edition.slug}/characters/${character.slug}/moves` : null,
  };
  return (
    <div className="space-y-6">
      <Breadcrumb
        trail={[
          { href: "/games", label: "Games" },
          { href: `/games/${game.slug}`, label: game.name },
        ]}
      />
      <header className="flex flex-wrap items-end justify-between gap-4">
        <div className="space-y-1">
          <h1 className="text-2xl font-semibold">{character.name}</h1>
          {character.summary && <p className="max-w-3xl text-ink-300">{character.summary}</p>}
          <p className="text-sm text-ink-400">
            {list.moves.length} moves · {list.cancels.length} stance cancels · {list.stances.length} stances
          </p>
        </div>
        <nav aria-label="Edition" className="flex flex-wrap items-center gap-2 text-sm">
          <span className="text-ink-400">Edition</span>
          {editions.map((e) => (
            <Link
              key={e.id}
              href={`?edition=${e.slug}`}
              aria-current={e.id === edition.id ? "page" : undefined}
              className={`rounded border px-2 py-1 no-underline ${
                e.id === edition.id ? "border-accent text-accent" : "border-ink-700 text-ink-300 hover:border-ink-400"
              }`}
            >
              {e.name}
            </Link>
          ))}
        </nav>
      </header>
      {editions.length > 1 && (
        <p className="text-sm">
          <Link
            href={`/games/${game.slug}/${character.slug}/changes${
              editions.indexOf(edition) < editions.length - 1 ? `?to=${edition.slug}` : ""
            }`}
          >
            What changed for {character.name} in {edition.name} →
          </Link>
        </p>
      )}
      {edits && (
        <p className="text-sm">
          <Link href={`/games/${game.slug}/${character.slug}/import?edition=${edition.slug}`}>
            Import {character.name} from a file into {edition.name} →
          </Link>
        </p>
      )}
      {unknownEdition !== undefined && (
        <p role="status" className="rounded border border-block-punishable/50 px-3 py-2 text-sm text-block-punishable">
          No Edition named “{unknownEdition}”: showing {edition.name}, the newest.
        </p>
      )}
      {list.moves.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-700 p-6 text-ink-300">
          {character.name} has no frame data in {edition.name}.
        </p>
      ) : cached ? (
        // A cached page is rendered without a query string: it shows the list as it comes, and
        // the browser applies the address's filters and order once it runs.
        <Suspense fallback={<MoveTableView {...table} search="" ready={false} />}>
          <MoveTable {...table} />
        </Suspense>
      ) : (
        <MoveTable {...table} />
      )}
    </div>
  );
}
