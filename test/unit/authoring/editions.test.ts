import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { AppError } from "@/lib/errors";
import { closeDb, getDb } from "@/server/db";
import { isPublishedEditionWrite } from "@/server/db/published";
import { listAudit } from "@/server/db/queries/audit";
import { createCharacter, createGame, createStance, publishEdition, startEdition } from "@/server/db/queries/authoring";
import { getCharacterGraph } from "@/server/db/queries/moves";
import { createTeam } from "@/server/db/queries/teams";
import { editions, moves, teams } from "@/server/db/schema";
import { seedCharacter } from "@/server/db/seed";
import { DEMO_CHARACTERS } from "@/server/db/seed/demo";
import { makeUser } from "../teams/fixtures";

// A team's own game, from its first draft Edition to the next one, against the test MariaDB.

const ctx = { teamId: 0, coachId: "" };

beforeAll(async () => {
  const coach = await makeUser("coach");
  const team = await createTeam({ name: "Authoring Crew", ownerId: coach.id });
  ctx.teamId = team.id;
  ctx.coachId = coach.id;
});

afterAll(async () => {
  const db = getDb();
  await db.delete(teams).where(eq(teams.id, ctx.teamId));
  await closeDb();
});

const refusal = (promise: Promise<unknown>) =>
  promise.then(
    () => null,
    (error: unknown) => (error instanceof AppError ? { code: error.code, message: error.message } : error),
  );

async function newGame(name: string) {
  return createGame({ teamId: ctx.teamId, actorId: ctx.coachId, input: { name, edition: "1.0" } });
}

describe("a team's game", () => {
  test("is made with a first Edition, a draft, and the log says who made it", async () => {
    const { game, edition } = await newGame("Lantern Rally");
    expect(game.slug).toMatch(/^lantern-rally/);
    expect(edition).toMatchObject({ name: "1.0", slug: "1-0", status: "draft", version: 1 });
    const log = await listAudit({ teamId: ctx.teamId });
    expect(log.at(-1)).toMatchObject({ action: "game.created", detail: { name: "Lantern Rally" } });
  });

  test("refuses a frame rate of 0 and a fastest attack of 2.5 frames, and makes no game", async () => {
    for (const input of [
      { name: "Odd Rules", fps: 0 },
      { name: "Odd Rules", fastest: 2.5 },
    ]) {
      const refused = await refusal(createGame({ teamId: ctx.teamId, actorId: ctx.coachId, input }));
      expect(refused).toMatchObject({ name: "ZodError" });
    }
    const log = await listAudit({ teamId: ctx.teamId });
    expect(log.filter((e) => e.detail.name === "Odd Rules")).toEqual([]);
  });

  test("characters get a slug of their own, also when two share a name", async () => {
    const { game } = await newGame("Slug Test");
    const a = await createCharacter({
      teamId: ctx.teamId,
      gameId: game.id,
      actorId: ctx.coachId,
      input: { name: "Player Vantorix" },
    });
    const b = await createCharacter({
      teamId: ctx.teamId,
      gameId: game.id,
      actorId: ctx.coachId,
      input: { name: "Player Vantorix" },
    });
    expect(a.slug).toBe("player-vantorix");
    expect(b.slug).toMatch(/^player-vantorix-[0-9a-f]{6}$/);
  });
});

describe("Editions", () => {
  test("the next one is a copy of the newest, by key: the same graph for every character", async () => {
    const { game, edition: first } = await newGame("Copy Check");
    // Two demo casts' frame data written into the draft, as an import would.
    const cast = [];
    for (const from of DEMO_CHARACTERS.slice(0, 2))
      cast.push(await seedCharacter(getDb(), game.slug, { ...from, slug: `${from.slug}-copy` }));

    expect(
      await refusal(
        startEdition({ teamId: ctx.teamId, gameId: game.id, actorId: ctx.coachId, input: { name: "1.1" } }),
      ),
    ).toMatchObject({
      code: "conflict",
      message: "“1.0” is still a draft: publish it before starting the next Edition.",
    });
    await publishEdition({ teamId: ctx.teamId, gameId: game.id, editionId: first.id, actorId: ctx.coachId });
    const next = await startEdition({
      teamId: ctx.teamId,
      gameId: game.id,
      actorId: ctx.coachId,
      input: { name: "1.1", releasedOn: "2026-12-01" },
    });
    expect(next).toMatchObject({ slug: "1-1", status: "draft", releasedOn: "2026-12-01" });

    for (const characterId of cast) {
      const before = await getCharacterGraph({ characterId, editionId: first.id });
      const after = await getCharacterGraph({ characterId, editionId: next.id });
      expect(before.graph.nodes.length).toBeGreaterThan(20);
      expect(after).toEqual(before);
    }
    // The copy is a draft: it takes changes, and the published one still refuses them.
    const db = getDb();
    await db.update(moves).set({ damage: 99 }).where(eq(moves.editionId, next.id));
    await expect(db.update(moves).set({ damage: 99 }).where(eq(moves.editionId, first.id))).rejects.toSatisfy(
      isPublishedEditionWrite,
    );
  });

  test("a stance goes into a draft only; a published Edition says to start a new one", async () => {
    const { game, edition } = await newGame("Stance Check");
    const character = await createCharacter({
      teamId: ctx.teamId,
      gameId: game.id,
      actorId: ctx.coachId,
      input: { name: "Pellowix" },
    });
    const stance = { key: "veil", name: "Veil", abbreviation: "VL" };
    const args = {
      teamId: ctx.teamId,
      gameId: game.id,
      editionId: edition.id,
      characterId: character.id,
      actorId: ctx.coachId,
    };
    await createStance({ ...args, input: stance });
    expect(await refusal(createStance({ ...args, input: stance }))).toMatchObject({ code: "conflict" });
    await publishEdition({ ...args });
    expect(await refusal(createStance({ ...args, input: { ...stance, key: "other" } }))).toMatchObject({
      code: "conflict",
      message: "This Edition is published, and a published Edition never changes. Start a new Edition to edit.",
    });
    expect(await refusal(publishEdition({ ...args }))).toMatchObject({ code: "conflict" });
    const [row] = await getDb().select().from(editions).where(eq(editions.id, edition.id));
    expect(row).toMatchObject({ status: "published", version: 2 });
    expect(row?.publishedAt).toBeInstanceOf(Date);
  });

  test("an Edition of another game is not found", async () => {
    const { edition } = await newGame("Mine");
    const { game: other } = await newGame("Theirs");
    expect(
      await refusal(
        publishEdition({ teamId: ctx.teamId, gameId: other.id, editionId: edition.id, actorId: ctx.coachId }),
      ),
    ).toMatchObject({ code: "not_found" });
  });
});
