import { randomUUID } from "node:crypto";
import { getDb } from "@/server/db";
import { characters, games } from "@/server/db/schema";

/** A public game of the test's own (its slug and name get a random tag) with one character. */
export async function gameWithCharacter(
  game: { slug: string; name: string },
  character: { slug: string; name: string },
): Promise<{ gameId: number; characterId: number }> {
  const db = getDb();
  const tag = randomUUID().slice(0, 8);
  const [g] = await db
    .insert(games)
    .values({ slug: `${game.slug}-${tag}`, name: `${game.name} ${tag}` })
    .$returningId();
  const [c] = await db
    .insert(characters)
    .values({ gameId: g!.id, ...character })
    .$returningId();
  return { gameId: g!.id, characterId: c!.id };
}
