import { z } from "zod";
import { requireUser } from "@/server/auth";
import { moveChangesSchema, saveMove } from "@/server/db/queries/move-edits";
import { characterOf, editionOf, loadGameForEdit } from "@/server/games-access";
import { handle, parseWith, readJson } from "@/server/http";
import { editionCharacterParamsSchema } from "../../../../../../../schema";

export const dynamic = "force-dynamic";

type Ctx = RouteContext<"/api/games/[game]/editions/[edition]/characters/[character]/moves/[move]">;

const paramsSchema = editionCharacterParamsSchema.extend({
  move: z.string().min(1, "Name the move by its key.").max(64, "A move's key is at most 64 characters."),
});

const saveSchema = z
  .object({
    version: z.number({ error: "Send the version you read the move at." }).int().min(1),
    changes: moveChangesSchema,
  })
  .strict();

/**
 * Saves changes to one move of a draft Edition (coaches and owners), based on the version the
 * editor read: a save based on an older one answers 409 with the move as it is now.
 */
export const PATCH = handle(async (request: Request, ctx: Ctx) => {
  const params = parseWith(paramsSchema, await ctx.params, "path");
  const body = await readJson(request, saveSchema, { maxBytes: 16_000 });
  const user = await requireUser();
  const { game } = await loadGameForEdit({ slug: params.game, user });
  const edition = await editionOf(game.id, params.edition);
  const character = await characterOf(game.id, params.character);
  const saved = await saveMove({
    teamId: game.teamId,
    gameId: game.id,
    editionId: edition.id,
    characterId: character.id,
    key: params.move,
    version: body.version,
    changes: body.changes,
    actorId: user.id,
  });
  return Response.json(saved);
});
