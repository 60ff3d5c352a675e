import { requireUser } from "@/server/auth";
import { createInvite, INVITE_DAYS, listPendingInvites } from "@/server/db/queries/invites";
import { handle, parseWith, readJson } from "@/server/http";
import { inviteLink, sendInviteMail } from "@/server/invites";
import { loadTeamFor } from "@/server/teams";
import { teamParamsSchema } from "../../schema";
import { inviteSchema } from "./schema";

export const dynamic = "force-dynamic";

/** Invites waiting for an answer: for coaches and owners, who send them. */
export const GET = handle(async (_request: Request, ctx: RouteContext<"/api/teams/[team]/invites">) => {
  const { team: slug } = parseWith(teamParamsSchema, await ctx.params, "path");
  const user = await requireUser();
  const { team } = await loadTeamFor({ slug, user, needed: "coach" });
  return Response.json({ invites: await listPendingInvites({ teamId: team.id }) });
});

/** Invites an e-mail address with a role, and mails the single-use link. */
export const POST = handle(async (request: Request, ctx: RouteContext<"/api/teams/[team]/invites">) => {
  const { team: slug } = parseWith(teamParamsSchema, await ctx.params, "path");
  const body = await readJson(request, inviteSchema, { maxBytes: 2_000 });
  const user = await requireUser();
  const { team, role } = await loadTeamFor({ slug, user, needed: "coach" });
  const { invite } = await createInvite({
    teamId: team.id,
    invitedBy: user.id,
    inviterRole: role,
    email: body.email,
    role: body.role,
    deliver: ({ token, email }) =>
      sendInviteMail({
        to: email,
        teamName: team.name,
        inviterName: user.name ?? user.email,
        role: body.role,
        url: inviteLink(token),
        expiresInDays: INVITE_DAYS,
      }),
  });
  return Response.json({ invite }, { status: 201 });
});
