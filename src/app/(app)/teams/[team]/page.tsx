import type { Metadata } from "next";
import { notFound, redirect } from "next/navigation";
import Link from "next/link";
import { NewGameForm } from "@/components/games/new-game-form";
import { TeamAdmin } from "@/components/teams/team-admin";
import { Breadcrumb } from "@/components/ui/breadcrumb";
import { AppError } from "@/lib/errors";
import { auth } from "@/server/auth";
import { atLeast } from "@/server/authz";
import { listAudit } from "@/server/db/queries/audit";
import { listBoards } from "@/server/db/queries/boards";
import { listPendingInvites } from "@/server/db/queries/invites";
import { listTeamGames } from "@/server/db/queries/games";
import { listTeamPermalinks } from "@/server/db/queries/permalinks";
import { listMembers } from "@/server/db/queries/teams";
import { loadTeamFor } from "@/server/teams";

type Props = PageProps<"/teams/[team]">;

export const metadata: Metadata = { title: "Team" };

/** One team: its members and roles, invites, shared links and log. Members only. */
export default async function TeamPage({ params }: Props) {
  const { team: slug } = await params;
  const user = await auth();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent(`/teams/${slug}`)}`);
  const loaded = await loadTeamFor({ slug, user, needed: "viewer" }).catch((e: unknown) => {
    if (e instanceof AppError && e.code === "not_found") return null;
    throw e;
  });
  if (!loaded) notFound();
  const { team, role } = loaded;
  const manages = atLeast(role, "coach");
  const [members, invites, audit, permalinks, games, boards] = await Promise.all([
    listMembers({ teamId: team.id }),
    manages ? listPendingInvites({ teamId: team.id }) : Promise.resolve([]),
    manages ? listAudit({ teamId: team.id }) : Promise.resolve([]),
    listTeamPermalinks({ teamId: team.id }),
    listTeamGames({ teamId: team.id }),
    listBoards({ teamId: team.id }),
  ]);
  return (
    <div className="space-y-4">
      <Breadcrumb trail={[{ href: "/teams", label: "Teams" }]} />
      <TeamAdmin team={team} me={{ id: user.id, role }} initial={{ members, invites, audit, permalinks }} />
      <section aria-labelledby="team-games" className="space-y-3">
        <h2 id="team-games" className="text-lg font-semibold">
          The team&apos;s games
        </h2>
        {games.length === 0 ? (
          <p className="text-ink-300">
            No games of the team&apos;s own yet.
            {manages ? " Start one below to bring in the frame data of the game you play." : ""}
          </p>
        ) : (
          <ul className="space-y-1">
            {games.map((g) => (
              <li key={g.id}>
                <Link href={`/games/${g.slug}`}>{g.name}</Link>
              </li>
            ))}
          </ul>
        )}
        {manages && <NewGameForm team={team.slug} />}
      </section>
      <section aria-labelledby="team-boards" className="space-y-3">
        <h2 id="team-boards" className="text-lg font-semibold">
          Mix-up boards
        </h2>
        {boards.length === 0 ? (
          <p className="text-ink-300">
            No boards yet.{" "}
            {manages
              ? "In the Explorer, pick a path that ends where the defender must guess and choose “Make a board”."
              : "Coaches make them from the Explorer; they show up here for the whole team."}
          </p>
        ) : (
          <ul className="divide-y divide-ink-800 rounded-lg border border-ink-800" data-testid="board-list">
            {boards.map((b) => (
              <li key={b.id} className="flex flex-wrap items-baseline justify-between gap-2 px-3 py-2">
                <Link href={`/teams/${team.slug}/boards/${b.id}`}>{b.title}</Link>
                <span className="text-xs text-ink-400">
                  {b.character.name}
                  {b.opponent ? ` vs ${b.opponent.name}` : ""} · {b.game.name} {b.edition.name} · version {b.version}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
