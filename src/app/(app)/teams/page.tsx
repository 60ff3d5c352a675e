import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { CreateTeamForm } from "@/components/teams/create-team-form";
import { RoleTag } from "@/components/teams/role-tag";
import { auth } from "@/server/auth";
import { listMyTeams } from "@/server/db/queries/teams";

export const metadata: Metadata = { title: "Teams" };

/** The teams the signed-in user belongs to, and a way to start one. */
export default async function TeamsPage() {
  const user = await auth();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent("/teams")}`);
  const teams = await listMyTeams({ userId: user.id });
  return (
    <div className="max-w-3xl space-y-6">
      <h1 className="text-xl font-semibold">Your teams</h1>
      {teams.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-700 p-4 text-sm text-ink-300" data-testid="no-teams">
          You are not in a team yet. Start one below, or open the invite link a coach sent you.
        </p>
      ) : (
        <ul className="divide-y divide-ink-800 rounded-lg border border-ink-800" data-testid="team-list">
          {teams.map((t) => (
            <li key={t.id} className="flex items-center justify-between gap-3 px-4 py-3">
              <Link href={`/teams/${t.slug}`} className="font-medium text-ink-100 underline-offset-2 hover:underline">
                {t.name}
              </Link>
              <RoleTag role={t.role} />
            </li>
          ))}
        </ul>
      )}
      <CreateTeamForm />
    </div>
  );
}
