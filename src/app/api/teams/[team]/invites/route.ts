import { requireUser } from "@/server/auth";
import { consume } from "@/server/auth/rate-limit";
import { createInvite, listPendingInvites } from "@/server/db/queries/invites";
import { handle, parseWith, readJson } from "@/server/http";
import { inviteMessage } from "@/server/invites";
import { deliverSoon } from "@/server/mail";
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

/**
 * Invites an e-mail address with a role. The invite and its e-mail are written together, and the
 * e-mail goes out after the answer (the mail outbox), so a slow mail server never holds it up.
 * Invites are limited per sender and per team (LIMITS in rate-limit.ts): each one mails a stranger.
 */
export const POST = handle(async (request: Request, ctx: RouteContext<"/api/teams/[team]/invites">) => {
  const { team: slug } = parseWith(teamParamsSchema, await ctx.params, "path");
  const body = await readJson(request, inviteSchema, { maxBytes: 2_000 });
  const user = await requireUser();
  const { team, role } = await loadTeamFor({ slug, user, needed: "coach" });
  await consume([
    ["inviteUser", user.id],
    ["inviteTeam", String(team.id)],
  ]);
  const { invite } = await createInvite({
    teamId: team.id,
    invitedBy: user.id,
    inviterRole: role,
    email: body.email,
    role: body.role,
    mail: inviteMessage,
  });
  deliverSoon();
  return Response.json({ invite }, { status: 201 });
});
