import "server-only";
import { notFound } from "next/navigation";
import { cache } from "react";
import { auth } from "@/server/auth";
import { canReadGame } from "@/server/games-access";
import { getCharacterBySlug, getGameBySlug } from "@/server/db/queries/games";
import { hasMove } from "@/server/db/queries/moves";

// Layouts check that the game and character exist before any page streams, so
// an unknown address answers 404 rather than a 200 that later shows "not found".
// `cache` lets the layout, the page and generateMetadata share one lookup.

/** A game the viewer may read; a team's game is "not found" to anyone outside the team. */
export const loadGame = cache(async (slug: string) => {
  const game = await getGameBySlug({ slug });
  if (!game) notFound();
  if (!(await canReadGame({ game, user: await auth() }))) notFound();
  return game;
});

export const loadCharacter = cache(async (gameSlug: string, characterSlug: string) => {
  const game = await loadGame(gameSlug);
  const character = await getCharacterBySlug({ gameId: game.id, slug: characterSlug });
  if (!character) notFound();
  return { game, character };
});

export const loadRootMove = cache(async (gameSlug: string, characterSlug: string, moveKey: string) => {
  const found = await loadCharacter(gameSlug, characterSlug);
  if (!(await hasMove({ characterId: found.character.id, key: moveKey }))) notFound();
  return found;
});
