import type { Metadata } from "next";
import Link from "next/link";
import { auth } from "@/server/auth";
import { listGames } from "@/server/db/queries/games";

export const metadata: Metadata = { title: "Games" };
export const dynamic = "force-dynamic";

export default async function GamesPage() {
  const user = await auth();
  const games = await listGames({ viewerId: user?.id ?? null });
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-semibold">Games</h1>
      {games.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-700 p-6 text-ink-300">
          No games yet. Run <code className="font-mono">npm run db:seed</code> to load the demo game.
        </p>
      ) : (
        <ul className="grid gap-4 sm:grid-cols-2">
          {games.map((g) => (
            <li key={g.id}>
              <Link
                href={`/games/${g.slug}`}
                className="block rounded-lg border border-ink-800 bg-ink-900 p-4 no-underline hover:border-accent-muted"
              >
                <span className="text-lg font-medium text-ink-100">{g.name}</span>
                {g.summary && <span className="mt-1 block text-sm text-ink-300">{g.summary}</span>}
                <span className="mt-2 block font-mono text-xs text-ink-400">
                  {g.fps} fps · fastest attack {g.fastest}f
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
