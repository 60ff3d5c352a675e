import { z } from "zod";
import { newMoveSchema, viaSchema } from "@/lib/character-edit";
import { requireUser } from "@/server/auth";
import { addMove } from "@/server/db/queries/character-edits";
import { characterForEdit } from "@/server/games-access";
import { handle, parseWith, readJson } from "@/server/http";
import { editionCharacterParamsSchema } from "../../../../../../schema";

export const dynamic = "force-dynamic";

type Ctx = RouteContext<"/api/games/[game]/editions/[edition]/characters/[character]/moves">;

const addSchema = z.object({ move: newMoveSchema, via: viaSchema.optional() }).strict();

/**
 * Adds a move to a character of a draft Edition (coaches and owners): alone, as a follow-up of a
 * move (`via` a follow) or as a move of a stance (`via` an enter). 201 with the move and its link.
 */
export const POST = handle(async (request: Request, ctx: Ctx) => {
  const params = parseWith(editionCharacterParamsSchema, await ctx.params, "path");
  const body = await readJson(request, addSchema, { maxBytes: 16_000 });
  const scope = await characterForEdit(params, await requireUser());
  const made = await addMove(scope, { op: "add-move", move: body.move, via: body.via });
  return Response.json(made, { status: 201 });
});
