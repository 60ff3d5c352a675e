import { auth } from "@/server/auth";
import { handle } from "@/server/http";
import { respondCreatePermalink } from "@/server/permalink-routes";

export const dynamic = "force-dynamic";

/** Shares an Explorer view as a permalink pinned to its Edition: a player or higher of the team. */
export const POST = handle((request: Request) => respondCreatePermalink({ request, currentUser: auth }));
