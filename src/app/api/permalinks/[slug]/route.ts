import { requireUser } from "@/server/auth";
import { revokePermalink } from "@/server/db/queries/permalinks";
import { handle, parseWith } from "@/server/http";
import { slugParamsSchema } from "../schema";

export const dynamic = "force-dynamic";

/** Revokes a permalink: its creator, or a coach or owner of the team (again: no change). */
export const DELETE = handle(async (_request: Request, ctx: RouteContext<"/api/permalinks/[slug]">) => {
  const { slug } = parseWith(slugParamsSchema, await ctx.params, "path");
  const user = await requireUser();
  return Response.json({ permalink: await revokePermalink({ slug, actorId: user.id }) });
});
