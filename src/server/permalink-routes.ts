import "server-only";
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { createPermalinkSchema, SLUG_PATTERN } from "@/lib/permalink";
import { requireRole } from "./authz";
import { createPermalink, revokePermalink } from "./db/queries/permalinks";
import { parseWith, readJson } from "./http";

/**
 * The bodies of the permalink route handlers, in the order every handler
 * keeps: parse → session → load → role → respond. The route files pass the
 * session reader (`auth` from `@/server/auth`) and wrap these in `handle()`.
 */
export type CurrentUser = () => Promise<{ id: string } | null>;

async function signedIn(currentUser: CurrentUser, doing: string): Promise<{ id: string }> {
  const user = await currentUser();
  if (!user) throw new AppError("unauthorized", `Sign in to ${doing}.`);
  return user;
}

/** POST /api/permalinks: a player or higher of the team shares a view; 201 with the permalink. */
export async function respondCreatePermalink({
  request,
  currentUser,
}: {
  request: Request;
  currentUser: CurrentUser;
}): Promise<Response> {
  const input = await readJson(request, createPermalinkSchema, { maxBytes: 16_000 });
  const user = await signedIn(currentUser, "share");
  await requireRole({ teamId: input.teamId, userId: user.id, needed: "player" });
  const permalink = await createPermalink({
    teamId: input.teamId,
    createdBy: user.id,
    characterId: input.characterId,
    editionSlug: input.edition,
    view: input.view,
    visibility: input.visibility,
  });
  return Response.json({ permalink }, { status: 201 });
}

const slugParamsSchema = z.object({
  slug: z.string().regex(SLUG_PATTERN, { error: "That is not a permalink's address." }),
});

/** DELETE /api/permalinks/[slug]: the creator, a coach or an owner revokes it (again: no change). */
export async function respondRevokePermalink({
  params,
  currentUser,
}: {
  params: unknown;
  currentUser: CurrentUser;
}): Promise<Response> {
  const { slug } = parseWith(slugParamsSchema, params, "path");
  const user = await signedIn(currentUser, "revoke a link");
  const permalink = await revokePermalink({ slug, actorId: user.id });
  return Response.json({ permalink });
}
