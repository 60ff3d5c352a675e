import { z } from "zod";
import { portableEdgeSchema } from "@/lib/character-file";
import { requireUser } from "@/server/auth";
import { addEdge } from "@/server/db/queries/character-edits";
import { characterForEdit } from "@/server/games-access";
import { handle, parseWith, readJson } from "@/server/http";
import { editionCharacterParamsSchema } from "../../../../../../schema";

export const dynamic = "force-dynamic";

type Ctx = RouteContext<"/api/games/[game]/editions/[edition]/characters/[character]/edges">;

const addSchema = z.object({ edge: portableEdgeSchema }).strict();

/**
 * Adds a link between two nodes a character of a draft Edition has (coaches and owners): a cancel
 * from a move into a stance, a follow from a move to a move, an enter from a stance to a move.
 */
export const POST = handle(async (request: Request, ctx: Ctx) => {
  const params = parseWith(editionCharacterParamsSchema, await ctx.params, "path");
  const body = await readJson(request, addSchema, { maxBytes: 16_000 });
  const scope = await characterForEdit(params, await requireUser());
  const made = await addEdge(scope, { op: "add-edge", edge: body.edge });
  return Response.json(made, { status: 201 });
});
