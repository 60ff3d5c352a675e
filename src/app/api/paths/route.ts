import { EngineInputError, explorePathsLimited } from "@/lib/engine";
import { AppError } from "@/lib/errors";
import { clientIp, consume } from "@/server/auth/rate-limit";
import { handle, readJson } from "@/server/http";
import { MAX_BODY_BYTES, MAX_PATHS, pathsRequestSchema } from "./schema";

/**
 * Every path from `root` through the posted graph, as the engine computes
 * them. Pure computation on the caller's own graph: no session is needed,
 * so each address has a budget, spent before the body is even read.
 */
export const POST = handle(async (request: Request) => {
  const ip = clientIp(request.headers);
  await consume([
    ["pathsIpMinute", ip],
    ["pathsIpHour", ip],
  ]);
  const body = await readJson(request, pathsRequestSchema, { maxBytes: MAX_BODY_BYTES });
  const limit = body.limit ?? MAX_PATHS;
  try {
    const { paths, truncated } = explorePathsLimited(body.graph, body.root, limit, body.options);
    return Response.json({ paths, truncated, limit });
  } catch (error) {
    if (error instanceof EngineInputError) throw new AppError("bad_request", error.message);
    throw error;
  }
});
