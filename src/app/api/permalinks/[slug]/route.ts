import { auth } from "@/server/auth";
import { handle } from "@/server/http";
import { respondRevokePermalink } from "@/server/permalink-routes";

export const dynamic = "force-dynamic";

/** Revokes a permalink: its creator, or a coach or owner of the team. */
export const DELETE = handle(async (_request: Request, ctx: RouteContext<"/api/permalinks/[slug]">) =>
  respondRevokePermalink({ params: await ctx.params, currentUser: auth }),
);
