import type { Metadata } from "next";
import { MoveListPage } from "@/app/_shared/move-list-page";
import { auth } from "@/server/auth";
import { atLeast, getRole } from "@/server/authz";
import { listEditions } from "@/server/db/queries/games";
import { getMoveList } from "@/server/db/queries/moves";
import { loadCharacter } from "../../../data";

type Props = PageProps<"/games/[game]/[character]">;

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { game, character } = await params;
  const found = await loadCharacter(game, character);
  return { title: `${found.character.name} · ${found.game.name}` };
}

/**
 * The move list, rendered for each request: a team's game, a draft, or an
 * address the proxy does not send to the cached copy (src/server/published.ts).
 */
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
  const user = edition.status === "draft" && game.teamId !== null ? await auth() : null;
  const role = user && game.teamId !== null ? await getRole({ teamId: game.teamId, userId: user.id }) : null;
  return (
    <MoveListPage
      game={game}
      character={character}
      editions={editions}
      edition={edition}
      list={list}
      edits={atLeast(role, "coach")}
      unknownEdition={typeof wanted === "string" && wanted !== edition.slug ? wanted : undefined}
    />
  );
}
