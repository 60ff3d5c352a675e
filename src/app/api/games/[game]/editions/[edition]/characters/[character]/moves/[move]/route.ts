import { z } from "zod";
import { requireUser } from "@/server/auth";
import { deleteMove, readMove } from "@/server/db/queries/character-edits";
import { moveChangesSchema, saveMove } from "@/server/db/queries/move-edits";
import { characterForEdit } from "@/server/games-access";
import { handle, parseWith, readJson } from "@/server/http";
import { moveParamsSchema, versionQuerySchema } from "../../../../../../../schema";

export const dynamic = "force-dynamic";

type Ctx = RouteContext<"/api/games/[game]/editions/[edition]/characters/[character]/moves/[move]">;

const saveSchema = z
  .object({
    version: z.number({ error: "Send the version you read the move at." }).int().min(1),
    changes: moveChangesSchema,
  })
  .strict();

/** The game, Edition and character a request names, for a coach or owner of the game's team. */
async function target(ctx: Ctx) {
  const params = parseWith(moveParamsSchema, await ctx.params, "path");
  return { key: params.move, scope: await characterForEdit(params, await requireUser()) };
}

/** One move as an editor opens it: its fields, its version and what deleting it would take along. */
export const GET = handle(async (_request: Request, ctx: Ctx) => {
  const { key, scope } = await target(ctx);
  return Response.json(await readMove(scope, key));
});

/**
 * Saves changes to one move of a draft Edition (coaches and owners), based on the version the
 * editor read: a save based on an older one answers 409 with the move as it is now.
 */
export const PATCH = handle(async (request: Request, ctx: Ctx) => {
  const body = await readJson(request, saveSchema, { maxBytes: 16_000 });
  const { key, scope } = await target(ctx);
  return Response.json(await saveMove({ ...scope, key, version: body.version, changes: body.changes }));
});

/**
 * Deletes a move of a draft Edition with every link into or out of it and the moves reached only
 * through it (`?version=N`, the version the editor read); answers what went with it.
 */
export const DELETE = handle(async (request: Request, ctx: Ctx) => {
  const { version } = parseWith(versionQuerySchema, Object.fromEntries(new URL(request.url).searchParams), "query");
  const { key, scope } = await target(ctx);
  return Response.json({ deleted: key, with: await deleteMove(scope, { key, version }) });
});
