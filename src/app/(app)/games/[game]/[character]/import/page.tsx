import type { Metadata } from "next";
import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import type { ReactNode } from "react";
import { CharacterImport } from "@/components/import/character-import";
import { Breadcrumb } from "@/components/ui/breadcrumb";
import { AppError } from "@/lib/errors";
import { auth } from "@/server/auth";
import { listEditions, rangeScaleOf } from "@/server/db/queries/games";
import { loadGameForEdit } from "@/server/games-access";
import { loadCharacter } from "../../../data";

type Props = PageProps<"/games/[game]/[character]/import">;

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { game, character } = await params;
  const found = await loadCharacter(game, character);
  return { title: `Import ${found.character.name} · ${found.game.name}` };
}

/**
 * A character file into a draft Edition (`?edition=`, by default the game's draft), for the
 * team's coaches and owners. Anyone else who may read the game is told why not, in the words
 * the edit routes use; a stranger gets the game's "not found" from `loadCharacter`.
 */
export default async function ImportPage({ params, searchParams }: Props) {
  const slugs = await params;
  const { game, character } = await loadCharacter(slugs.game, slugs.character);
  const here = `/games/${game.slug}/${character.slug}/import`;
  const user = await auth();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent(here)}`);

  const shell = (body: ReactNode) => (
    <div className="space-y-6">
      <Breadcrumb
        trail={[
          { href: "/games", label: "Games" },
          { href: `/games/${game.slug}`, label: game.name },
          { href: `/games/${game.slug}/${character.slug}`, label: character.name },
        ]}
      />
      <h1 className="text-2xl font-semibold">Import {character.name}’s frame data</h1>
      {body}
    </div>
  );
  const notice = (text: ReactNode) => (
    <p role="status" className="max-w-3xl rounded border border-ink-700 px-3 py-2 text-ink-200">
      {text}
    </p>
  );

  try {
    await loadGameForEdit({ slug: game.slug, user });
  } catch (error) {
    if (error instanceof AppError && error.code === "forbidden") return shell(notice(error.message));
    if (error instanceof AppError && error.code === "not_found") notFound();
    throw error;
  }

  const editions = await listEditions({ gameId: game.id });
  const wanted = (await searchParams).edition;
  const gameLink = <Link href={`/games/${game.slug}`}>{game.name}’s page</Link>;
  const edition =
    typeof wanted === "string" ? editions.find((e) => e.slug === wanted) : editions.find((e) => e.status === "draft");

  if (!edition) {
    const draft = editions.find((e) => e.status === "draft");
    if (typeof wanted === "string" && draft) {
      return shell(
        notice(
          <>
            {game.name} has no Edition named “{wanted}”.{" "}
            <Link href={`${here}?edition=${draft.slug}`}>Import into the draft, {draft.name}</Link>.
          </>,
        ),
      );
    }
    return shell(
      notice(
        <>
          {game.name} has no draft Edition to import into. Start a new Edition on {gameLink}, then come back here.
        </>,
      ),
    );
  }
  if (edition.status === "published") {
    return shell(
      notice(
        <>
          {edition.name} is published, so its frame data no longer changes. Start a new Edition on {gameLink}: it begins
          as a draft copy of the newest, and you can import into it.
        </>,
      ),
    );
  }

  return shell(
    <>
      <p className="max-w-3xl text-ink-300">
        Into the draft <strong className="text-ink-100">{edition.name}</strong>. The file replaces {character.name}’s
        moves, stances and connections in this draft: what the file has is added or changed, what it lacks is removed.
        Start from an example (
        <a href="/examples/merrith.csv" download>
          CSV
        </a>
        ,{" "}
        <a href="/examples/merrith.json" download>
          JSON
        </a>
        ) or an export of another Edition; the file’s character key must be “{character.slug}”.
      </p>
      <CharacterImport
        game={game.slug}
        character={{ slug: character.slug, name: character.name }}
        edition={{ slug: edition.slug, name: edition.name }}
        range={rangeScaleOf(game)}
      />
    </>,
  );
}
