import type { Metadata } from "next";
import { notFound, redirect } from "next/navigation";
import { TeamAdmin } from "@/components/teams/team-admin";
import { Breadcrumb } from "@/components/ui/breadcrumb";
import { AppError } from "@/lib/errors";
import { auth } from "@/server/auth";
import { atLeast } from "@/server/authz";
import { listAudit } from "@/server/db/queries/audit";
import { listPendingInvites } from "@/server/db/queries/invites";
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
  const [members, invites, audit, permalinks] = await Promise.all([
    listMembers({ teamId: team.id }),
    manages ? listPendingInvites({ teamId: team.id }) : Promise.resolve([]),
    manages ? listAudit({ teamId: team.id }) : Promise.resolve([]),
    listTeamPermalinks({ teamId: team.id }),
  ]);
  return (
    <div className="space-y-4">
      <Breadcrumb trail={[{ href: "/teams", label: "Teams" }]} />
      <TeamAdmin team={team} me={{ id: user.id, role }} initial={{ members, invites, audit, permalinks }} />
    </div>
  );
}
