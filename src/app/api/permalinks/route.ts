import { createPermalinkSchema } from "@/lib/permalink";
import { requireUser } from "@/server/auth";
import { requireRole } from "@/server/authz";
import { createBoardPermalink, createPermalink, createStancePermalink } from "@/server/db/queries/permalinks";
import { handle, readJson } from "@/server/http";

export const dynamic = "force-dynamic";

/**
 * Shares an Explorer view as a permalink pinned to its Edition, or one of the team's Mix-up
 * boards (`kind: "board"`, pinned to the board's character and Edition): a player or higher of
 * the team; 201. A stance sheet (`kind: "stance"`) is pinned like a view.
 */
export const POST = handle(async (request: Request) => {
  const input = await readJson(request, createPermalinkSchema, { maxBytes: 16_000 });
  const user = await requireUser();
  await requireRole({ teamId: input.teamId, userId: user.id, needed: "player" });
  const by = { teamId: input.teamId, createdBy: user.id, visibility: input.visibility };
  const permalink =
    input.kind === "board"
      ? await createBoardPermalink({ ...by, view: input.view })
      : input.kind === "stance"
        ? await createStancePermalink({
            ...by,
            characterId: input.characterId,
            editionSlug: input.edition,
            view: input.view,
          })
        : await createPermalink({
            ...by,
            characterId: input.characterId,
            editionSlug: input.edition,
            view: input.view,
          });
  return Response.json({ permalink }, { status: 201 });
});
