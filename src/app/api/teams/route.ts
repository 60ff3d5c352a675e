import { requireUser } from "@/server/auth";
import { createTeam, listMyTeams } from "@/server/db/queries/teams";
import { handle, readJson } from "@/server/http";
import { createTeamSchema } from "./schema";

export const dynamic = "force-dynamic";

/** The signed-in user's teams, with their role in each. */
export const GET = handle(async () => {
  const user = await requireUser();
  return Response.json({ teams: await listMyTeams({ userId: user.id }) });
});

/** Creates a team; its creator is its first owner. */
export const POST = handle(async (request: Request) => {
  const body = await readJson(request, createTeamSchema, { maxBytes: 4_000 });
  const user = await requireUser();
  const team = await createTeam({ name: body.name, ownerId: user.id });
  return Response.json({ team }, { status: 201 });
});
