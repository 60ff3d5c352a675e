import type { Metadata } from "next";
import Link from "next/link";
import { AcceptInviteButton } from "@/components/teams/accept-invite-button";
import { RoleTag } from "@/components/teams/role-tag";
import { auth } from "@/server/auth";
import { INVITE_PROBLEM, lookupInvite } from "@/server/db/queries/invites";
import { decodeSegment } from "@/lib/segment";

type Props = PageProps<"/invites/[token]">;

export const metadata: Metadata = { title: "Team invite", referrer: "no-referrer" };

/** Where an invite e-mail's link lands: who invited you, to what, and how to accept. */
export default async function InvitePage({ params }: Props) {
  const { token } = await params;
  const [invite, user] = await Promise.all([lookupInvite({ token: decodeSegment(token) }), auth()]);
  const here = `/invites/${token}`;

  if (invite.status !== "valid") {
    return (
      <div className="max-w-xl space-y-3" data-testid="invite">
        <h1 className="text-xl font-semibold">This invite cannot be used</h1>
        <p role="alert" className="text-ink-200">
          {INVITE_PROBLEM[invite.status]}
        </p>
        <Link href="/teams" className="text-accent underline">
          Go to your teams
        </Link>
      </div>
    );
  }

  const mine = user !== null && user.email.toLowerCase() === invite.email;
  return (
    <div className="max-w-xl space-y-4" data-testid="invite">
      <h1 className="text-xl font-semibold">Join {invite.teamName}</h1>
      <p className="text-ink-200">
        {invite.inviterName ?? "A coach"} invited <span className="font-mono">{invite.email}</span> to join{" "}
        <strong>{invite.teamName}</strong> as <RoleTag role={invite.role} />.
      </p>
      {mine ? (
        <AcceptInviteButton token={decodeSegment(token)} />
      ) : user ? (
        <p role="alert" className="rounded border border-block-punishable/50 p-3 text-sm">
          You are signed in as {user.email}, but this invite is for {invite.email}. Sign out, then open this link again
          and sign in with that address.
        </p>
      ) : (
        <div className="flex flex-wrap gap-3">
          <Link
            href={`/sign-up?email=${encodeURIComponent(invite.email)}&callbackUrl=${encodeURIComponent(here)}`}
            className="rounded bg-accent px-3 py-1.5 text-sm font-medium text-ink-950 no-underline"
          >
            Create an account to accept
          </Link>
          <Link
            href={`/sign-in?callbackUrl=${encodeURIComponent(here)}`}
            className="rounded border border-ink-600 px-3 py-1.5 text-sm text-ink-100 no-underline"
          >
            I have an account: sign in
          </Link>
        </div>
      )}
    </div>
  );
}
