import type { Metadata } from "next";
import Link from "next/link";
import { Breadcrumb } from "@/components/ui/breadcrumb";
import { MoveTable } from "@/components/moves/move-table";
import { auth } from "@/server/auth";
import { atLeast, getRole } from "@/server/authz";
import { listEditions, rangeScaleOf } from "@/server/db/queries/games";
import { getMoveList } from "@/server/db/queries/moves";
import { loadCharacter } from "../../../data";

type Props = PageProps<"/games/[game]/[character]">;

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { game, character } = await params;
  const found = await loadCharacter(game, character);
  return { title: `${found.character.name} · ${found.game.name}` };
}

export default async function CharacterPage({ params, searchParams }: Props) {
  const slugs = await params;
  const { game, character } = await loadCharacter(slugs.game, slugs.character);
  const editions = await listEditions({ gameId: game.id });
  const wanted = (await searchParams).edition;
  const edition = editions.find((e) => e.slug === wanted) ?? editions[0];
  if (!edition) {
    return <p className="text-ink-300">{game.name} has no Edition of frame data yet.</p>;
  }
  const list = await getMoveList({ characterId: character.id, editionId: edition.id });
  const unknownEdition = typeof wanted === "string" && wanted !== edition.slug;
  const user = edition.status === "draft" && game.teamId !== null ? await auth() : null;
  const role = user && game.teamId !== null ? await getRole({ teamId: game.teamId, userId: user.id }) : null;
  // A coach or owner on a draft: the import link, and numbers fixed in place in the list.
  const edits = atLeast(role, "coach");

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
      {unknownEdition && (
        <p role="status" className="rounded border border-block-punishable/50 px-3 py-2 text-sm text-block-punishable">
          No Edition named “{String(wanted)}”: showing {edition.name}, the newest.
        </p>
      )}
      {list.moves.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-700 p-6 text-ink-300">
          {character.name} has no frame data in {edition.name}.
        </p>
      ) : (
        <MoveTable
          list={list}
          rules={{ fastest: game.fastest, launchAt: game.launchAt }}
          range={rangeScaleOf(game)}
          exploreBase={`/games/${game.slug}/${character.slug}/explore`}
          stanceSheets={{ gameSlug: game.slug, characterSlug: character.slug }}
          edition={edition.slug}
          editBase={
            edits ? `/api/games/${game.slug}/editions/${edition.slug}/characters/${character.slug}/moves` : null
          }
        />
      )}
    </div>
  );
}
