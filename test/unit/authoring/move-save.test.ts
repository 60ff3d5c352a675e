import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, test, vi } from "vitest";
import { PATCH } from "@/app/api/games/[game]/editions/[edition]/characters/[character]/moves/[move]/route";
import { closeDb, getDb } from "@/server/db";
import { listAudit } from "@/server/db/queries/audit";
import { publishEdition } from "@/server/db/queries/authoring";
import { moves } from "@/server/db/schema";
import { asUser } from "../teams/parallel-session";
import { twoCoachesAndADraft, type TwoCoaches } from "./two-coaches";
import { oneMove } from "../authz/world";

// Two coaches edit one move of a draft: the save based on the version both read wins once; the
// other gets 409 with the winner's values, and nothing of the winner's is lost.

vi.mock("@/server/auth", () => import("../teams/parallel-session"));

let ctx: TwoCoaches;

beforeAll(async () => {
  ctx = await twoCoachesAndADraft({
    team: "Two Editors",
    game: "Race Game",
    character: "Vell",
    users: ["coach-a", "coach-b"],
  });
  await getDb()
    .insert(moves)
    .values(oneMove(ctx.edition.id, ctx.characterId, "2"));
});

afterAll(async () => {
  await ctx.remove();
  await closeDb();
});

function save(body: unknown, move = "2", coach = 0) {
  const params = { game: ctx.game.slug, edition: ctx.edition.slug, character: "vell", move };
  return asUser(ctx.coaches[coach]!, () =>
    PATCH(
      new Request("http://test/api", {
        method: "PATCH",
        headers: { "content-type": "application/json" },
        body: JSON.stringify(body),
      }),
      { params: Promise.resolve(params) },
    ),
  );
}

const row = async () =>
  (
    await getDb()
      .select()
      .from(moves)
      .where(and(eq(moves.editionId, ctx.edition.id), eq(moves.key, "2")))
  )[0]!;

describe("saving a move", () => {
  test("a save based on the current version changes the fields, moves the version on and writes the log", async () => {
    const before = await row();
    const res = await save({ version: before.version, changes: { onBlock: -9, name: "Heavy Poke" } });
    expect(res.status).toBe(200);
    const body = (await res.json()) as { version: number; move: { onBlock: unknown; name: string } };
    expect(body).toMatchObject({ version: before.version + 1, move: { onBlock: -9, name: "Heavy Poke" } });
    expect(await row()).toMatchObject({ onBlock: -9, name: "Heavy Poke", version: before.version + 1 });
    expect((await listAudit({ teamId: ctx.teamId })).at(-1)).toMatchObject({
      action: "move.changed",
      detail: { move: "2", fields: "name, onBlock" },
    });
  });

  test("two coaches save at once from the same version: one wins, the other gets 409 with both values to compare", async () => {
    const { version } = await row();
    const logBefore = (await listAudit({ teamId: ctx.teamId })).length;
    // Two people, each with their own session, at the same time against MariaDB.
    const [a, b] = await Promise.all([
      save({ version, changes: { damage: 21 } }, "2", 0),
      save({ version, changes: { damage: 34 } }, "2", 1),
    ]);
    const answers = [
      { sent: 21, status: a.status, body: (await a.json()) as Record<string, unknown> },
      { sent: 34, status: b.status, body: (await b.json()) as Record<string, unknown> },
    ];
    const won = answers.filter((x) => x.status === 200);
    const lost = answers.filter((x) => x.status === 409);
    expect(won).toHaveLength(1);
    expect(lost).toHaveLength(1);
    const winner = won[0]!.sent;
    // The refused editor is shown the row as it is now: the winner's damage, at the new version.
    expect(lost[0]!.body).toMatchObject({
      error: { code: "conflict", current: { version: version + 1, move: { damage: winner } } },
    });
    expect(await row()).toMatchObject({ damage: winner, version: version + 1 });
    expect((await listAudit({ teamId: ctx.teamId })).length).toBe(logBefore + 1);
  });

  test("bad values are refused at their field and change nothing", async () => {
    const before = await row();
    const res = await save({ version: before.version, changes: { damage: -3, level: "overhead" } });
    expect(res.status).toBe(400);
    const body = (await res.json()) as { error: { issues: { path: (string | number)[] }[] } };
    expect(body.error.issues.map((i) => i.path.join("."))).toEqual(
      expect.arrayContaining(["changes.damage", "changes.level"]),
    );
    expect(await row()).toEqual(before);
  });

  test("an unknown move is 404; once the Edition is published, a save is 409 and says why", async () => {
    expect((await save({ version: 1, changes: { damage: 1 } }, "no-such-move")).status).toBe(404);
    const before = await row();
    await publishEdition({
      teamId: ctx.teamId,
      gameId: ctx.game.id,
      editionId: ctx.edition.id,
      actorId: ctx.coaches[0]!.id,
    });
    const res = await save({ version: before.version, changes: { damage: 1 } });
    expect(res.status).toBe(409);
    expect(((await res.json()) as { error: { message: string } }).error.message).toMatch(/published/);
    expect(await row()).toEqual(before);
  });
});
