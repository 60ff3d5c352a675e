import type { Metadata } from "next";
import Link from "next/link";
import { Breadcrumb } from "@/components/ui/breadcrumb";
import { GameAdmin } from "@/components/games/game-admin";
import { auth } from "@/server/auth";
import { atLeast, getRole } from "@/server/authz";
import { listCharacters, listEditions } from "@/server/db/queries/games";
import { loadGame } from "../data";

type Props = PageProps<"/games/[game]">;

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const game = await loadGame((await params).game);
  return { title: game.name };
}

export default async function GamePage({ params }: Props) {
  const game = await loadGame((await params).game);
  const user = await auth();
  const [characters, editions, role] = await Promise.all([
    listCharacters({ gameId: game.id }),
    listEditions({ gameId: game.id }),
    game.teamId !== null && user ? getRole({ teamId: game.teamId, userId: user.id }) : null,
  ]);
  const edits = atLeast(role, "coach");
  const draft = editions.find((e) => e.status === "draft");
  return (
    <div className="space-y-6">
      <Breadcrumb trail={[{ href: "/games", label: "Games" }]} />
      <header className="space-y-1">
        <h1 className="text-2xl font-semibold">{game.name}</h1>
        {game.summary && <p className="max-w-3xl text-ink-300">{game.summary}</p>}
        <p className="font-mono text-xs text-ink-400">
          {game.fps} fps · fastest attack {game.fastest}f · launch punish from -{game.launchAt} · range{" "}
          {game.rangeKind === "number" ? `in ${game.rangeUnit ?? "units"}` : "as labels"}
        </p>
      </header>
      <section aria-labelledby="characters" className="space-y-3">
        <h2 id="characters" className="text-sm font-semibold tracking-wider text-ink-400 uppercase">
          Characters
        </h2>
        {characters.length === 0 ? (
          <p className="text-ink-300">
            This game has no characters yet.{edits && " Add the first one below, then bring its moves in from a file."}
          </p>
        ) : (
          <ul className="grid gap-3 sm:grid-cols-3">
            {characters.map((c) => (
              <li key={c.id}>
                <Link
                  href={`/games/${game.slug}/${c.slug}`}
                  className="block h-full rounded-lg border border-ink-800 bg-ink-900 p-4 no-underline hover:border-accent-muted"
                >
                  <span className="font-medium text-ink-100">{c.name}</span>
                  {c.summary && <span className="mt-1 block text-sm text-ink-300">{c.summary}</span>}
                </Link>
              </li>
            ))}
          </ul>
        )}
      </section>
      <section aria-labelledby="editions" className="space-y-3">
        <h2 id="editions" className="text-sm font-semibold tracking-wider text-ink-400 uppercase">
          Editions
        </h2>
        <ul className="space-y-1 text-sm">
          {editions.map((e, i) => (
            <li key={e.id} className="flex gap-3">
              <span className="font-mono text-ink-400">{e.releasedOn}</span>
              <span>{e.name}</span>
              {e.status === "draft" && (
                <span className="rounded border border-accent-muted px-1 text-xs text-accent">draft</span>
              )}
              {i === 0 && <span className="text-xs text-accent">newest</span>}
            </li>
          ))}
        </ul>
      </section>
      {edits && (
        <section aria-labelledby="edit-game" className="space-y-3 rounded-lg border border-ink-800 p-4">
          <h2 id="edit-game" className="text-sm font-semibold tracking-wider text-ink-400 uppercase">
            Edit this game
          </h2>
          <GameAdmin game={game.slug} editions={editions} />
          {draft && characters.length > 0 && (
            <nav aria-label="Import from a file" className="flex flex-wrap items-center gap-2 text-sm">
              <span className="text-ink-400">Import frame data from a file into {draft.name}:</span>
              {characters.map((c) => (
                <Link
                  key={c.id}
                  href={`/games/${game.slug}/${c.slug}/import?edition=${draft.slug}`}
                  aria-label={`Import ${c.name} into ${draft.name}`}
                  className="rounded border border-ink-700 px-2 py-1 no-underline hover:border-accent-muted"
                >
                  {c.name}
                </Link>
              ))}
            </nav>
          )}
        </section>
      )}
    </div>
  );
}
