import { formatProblem, MAX_FILE_BYTES, parseCharacterFile, sizeProblem, type FileProblem } from "@/lib/character-file";
import { AppError } from "@/lib/errors";
import { requireUser } from "@/server/auth";
import { importCharacter } from "@/server/db/queries/character-io";
import { rangeScaleOf } from "@/server/db/queries/games";
import { characterOf, editionOf, loadGameForEdit } from "@/server/games-access";
import { handle, parseWith, readUpload } from "@/server/http";
import { editionCharacterParamsSchema } from "../../../../../../schema";
import { importQuerySchema } from "./schema";

export const dynamic = "force-dynamic";

type Ctx = RouteContext<"/api/games/[game]/editions/[edition]/characters/[character]/import">;

const TOO_LARGE = `The file is larger than ${MAX_FILE_BYTES / (1024 * 1024)} MB. Split the Edition into one file per character.`;

/** Every problem of a file, with its line or path: 400, and nothing written. */
function refused(problems: FileProblem[]): Response {
  const n = problems.length;
  const first = problems[0] ? ` First: ${formatProblem(problems[0])}` : "";
  return Response.json(
    {
      error: {
        code: "bad_request",
        message: `The file has ${n} problem${n === 1 ? "" : "s"}; nothing was imported.${first}`,
      },
      preview: null,
      problems,
    },
    { status: 400 },
  );
}

/**
 * A character file (CSV or JSON, a form's `file` field) into a character of a draft Edition:
 * with `?preview=1` the answer says what would be added, changed and removed and nothing is
 * written; without it the whole file is written in one transaction, or nothing is. The file is
 * parsed here again, whatever the browser made of it.
 */
export const POST = handle(async (request: Request, ctx: Ctx) => {
  const params = parseWith(editionCharacterParamsSchema, await ctx.params, "path");
  const { preview } = parseWith(importQuerySchema, Object.fromEntries(new URL(request.url).searchParams), "query");
  const user = await requireUser();
  const { game } = await loadGameForEdit({ slug: params.game, user });
  const edition = await editionOf(game.id, params.edition);
  const character = await characterOf(game.id, params.character);

  const file = await readUpload(request, { field: "file", maxBytes: MAX_FILE_BYTES, tooLargeMessage: TOO_LARGE });
  if (sizeProblem(file.size)) throw new AppError("payload_too_large", TOO_LARGE);
  const parsed = parseCharacterFile(file.name, new Uint8Array(await file.arrayBuffer()), {
    range: rangeScaleOf(game),
  });
  if (!parsed.ok) return refused(parsed.problems);
  const mine = parsed.characters.find((c) => c.character.slug === character.slug) ?? parsed.characters[0]!;

  const result = await importCharacter({
    teamId: game.teamId,
    gameId: game.id,
    editionId: edition.id,
    characterId: character.id,
    actorId: user.id,
    character: mine,
    apply: preview !== "1",
  });
  if (!result.ok) return refused(result.problems);
  return Response.json({ preview: result.preview, problems: [], applied: result.applied, counts: result.counts });
});
