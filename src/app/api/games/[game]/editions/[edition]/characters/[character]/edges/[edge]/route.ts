import { z } from "zod";
import { edgeChangesSchema } from "@/lib/character-edit";
import { requireUser } from "@/server/auth";
import { deleteEdge, readEdge, saveEdge } from "@/server/db/queries/character-edits";
import { characterForEdit } from "@/server/games-access";
import { handle, parseWith, readJson } from "@/server/http";
import { edgeParamsSchema, versionQuerySchema } from "../../../../../../../schema";

export const dynamic = "force-dynamic";

type Ctx = RouteContext<"/api/games/[game]/editions/[edition]/characters/[character]/edges/[edge]">;

const saveSchema = z
  .object({
    version: z.number({ error: "Send the version you read the link at." }).int().min(1),
    changes: edgeChangesSchema,
  })
  .strict();

/** The game, Edition and character a request names, for a coach or owner of the game's team. */
async function target(ctx: Ctx) {
  const params = parseWith(edgeParamsSchema, await ctx.params, "path");
  return { key: params.edge, scope: await characterForEdit(params, await requireUser()) };
}

/** One link as an editor opens it: its fields and version. */
export const GET = handle(async (_request: Request, ctx: Ctx) => {
  const { key, scope } = await target(ctx);
  return Response.json(await readEdge(scope, key));
});

/** Saves changes to one link of a draft Edition, based on the version the editor read (409 if it moved on). */
export const PATCH = handle(async (request: Request, ctx: Ctx) => {
  const body = await readJson(request, saveSchema, { maxBytes: 16_000 });
  const { key, scope } = await target(ctx);
  return Response.json(await saveEdge(scope, { key, version: body.version, changes: body.changes }));
});

/** Deletes one link of a draft Edition (`?version=N`, the version the editor read). */
export const DELETE = handle(async (request: Request, ctx: Ctx) => {
  const { version } = parseWith(versionQuerySchema, Object.fromEntries(new URL(request.url).searchParams), "query");
  const { key, scope } = await target(ctx);
  await deleteEdge(scope, { key, version });
  return new Response(null, { status: 204 });
});
