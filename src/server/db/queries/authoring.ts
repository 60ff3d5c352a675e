import "server-only";
import { randomBytes } from "node:crypto";
import { and, desc, eq, sql } from "drizzle-orm";
import {
  newCharacterSchema,
  newEditionSchema,
  newGameSchema,
  newStanceSchema,
  slugify,
  type NewCharacter,
  type NewEdition,
  type NewGame,
  type NewStance,
} from "@/lib/authoring";
import { AppError } from "@/lib/errors";
import { getDb } from "../index";
import { PUBLISHED_MESSAGE } from "../published";
import { characters, editions, edges, games, moves, stances } from "../schema";
import { recordAudit, type Executor } from "./audit";

/**
 * A team's own games: making a game, its characters and stances, starting an Edition as a draft
 * copy of the newest one, and publishing it. Callers have checked that the actor is a coach or
 * owner of the game's team; every change writes the team's log in the same transaction.
 */

type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

export interface EditionDto {
  id: number;
  slug: string;
  name: string;
  releasedOn: string;
  status: "draft" | "published";
  version: number;
}

const day = (date: Date) => date.toISOString().slice(0, 10);

/** Who changes which team's game, with what. */
interface GameChange<Input> {
  teamId: number;
  gameId: number;
  actorId: string;
  input: Input;
}

/** A slug no other row of the scope has: the name's, with a short random tail when it is taken. */
async function freeSlug(taken: (slug: string) => Promise<boolean>, name: string, fallback: string): Promise<string> {
  const base = slugify(name, fallback);
  if (!(await taken(base))) return base;
  for (;;) {
    const slug = `${base.slice(0, 40)}-${randomBytes(3).toString("hex")}`;
    if (!(await taken(slug))) return slug;
  }
}

/** A team's game with its first Edition, a draft to fill in. */
export async function createGame({
  teamId,
  actorId,
  input,
}: {
  teamId: number;
  actorId: string;
  input: NewGame;
}): Promise<{ game: { id: number; slug: string; name: string }; edition: EditionDto }> {
  const { edition: editionName, ...game } = newGameSchema.parse(input);
  return getDb().transaction(async (tx) => {
    const slug = await freeSlug(
      async (s) => (await tx.select({ id: games.id }).from(games).where(eq(games.slug, s))).length > 0,
      game.name,
      "game",
    );
    const [made] = await tx
      .insert(games)
      .values({ ...game, summary: game.summary ?? null, slug, teamId })
      .$returningId();
    const edition = await insertEdition(tx, made!.id, { name: editionName });
    await recordAudit(tx, { teamId, actorId, action: "game.created", detail: { game: slug, name: game.name } });
    return { game: { id: made!.id, slug, name: game.name }, edition };
  });
}

/** A character of a game: it has frame data in every Edition from the one it is first edited in. */
export async function createCharacter({
  teamId,
  gameId,
  actorId,
  input,
}: GameChange<NewCharacter>): Promise<{ id: number; slug: string; name: string }> {
  const { name, summary } = newCharacterSchema.parse(input);
  return getDb().transaction(async (tx) => {
    const slug = await freeSlug(
      async (s) =>
        (
          await tx
            .select({ id: characters.id })
            .from(characters)
            .where(and(eq(characters.gameId, gameId), eq(characters.slug, s)))
        ).length > 0,
      name,
      "character",
    );
    const [made] = await tx
      .insert(characters)
      .values({ gameId, slug, name, summary: summary ?? null })
      .$returningId();
    await recordAudit(tx, { teamId, actorId, action: "character.created", detail: { character: slug, name } });
    return { id: made!.id, slug, name };
  });
}

/**
 * The Edition row, read with a lock so its status cannot change under the write that follows;
 * refused unless it is a draft of this game.
 */
export async function lockDraft(tx: Executor, gameId: number, editionId: number): Promise<EditionDto> {
  const [row] = await tx
    .select()
    .from(editions)
    .where(and(eq(editions.id, editionId), eq(editions.gameId, gameId)))
    .for("update");
  if (!row) throw new AppError("not_found", "No such Edition.");
  if (row.status !== "draft") throw new AppError("conflict", PUBLISHED_MESSAGE);
  return toDto(row);
}

/** A stance of a character in a draft Edition. */
export async function createStance({
  teamId,
  gameId,
  editionId,
  characterId,
  actorId,
  input,
}: GameChange<NewStance> & { editionId: number; characterId: number }): Promise<{ id: number; key: string }> {
  const stance = newStanceSchema.parse(input);
  return getDb().transaction(async (tx) => {
    await lockDraft(tx, gameId, editionId);
    const [taken] = await tx
      .select({ id: stances.id })
      .from(stances)
      .where(and(eq(stances.editionId, editionId), eq(stances.characterId, characterId), eq(stances.key, stance.key)));
    if (taken) throw new AppError("conflict", `This character already has a stance with the key “${stance.key}”.`);
    const [made] = await tx
      .insert(stances)
      .values({ ...stance, notes: stance.notes ?? null, editionId, characterId })
      .$returningId();
    await recordAudit(tx, {
      teamId,
      actorId,
      action: "stance.created",
      detail: { edition: editionId, character: characterId, key: stance.key },
    });
    return { id: made!.id, key: stance.key };
  });
}

/**
 * Starts the next Edition of a game: a draft copy of the newest one (its stances, moves and
 * edges, by key), so a patch is entered as the changes it made. One draft at a time: a game
 * whose newest Edition is still a draft is told to publish it first.
 */
export async function startEdition({ teamId, gameId, actorId, input }: GameChange<NewEdition>): Promise<EditionDto> {
  const fields = newEditionSchema.parse(input);
  return getDb().transaction(async (tx) => {
    // The game's row is the lock: two coaches starting an Edition at once make one.
    await tx.select({ id: games.id }).from(games).where(eq(games.id, gameId)).for("update");
    const [newest] = await tx
      .select()
      .from(editions)
      .where(eq(editions.gameId, gameId))
      .orderBy(desc(editions.releasedOn), desc(editions.id))
      .limit(1);
    if (newest?.status === "draft")
      throw new AppError("conflict", `“${newest.name}” is still a draft: publish it before starting the next Edition.`);
    const edition = await insertEdition(tx, gameId, fields);
    if (newest) await copyEdition(tx, newest.id, edition.id);
    await recordAudit(tx, {
      teamId,
      actorId,
      action: "edition.started",
      detail: { edition: edition.slug, name: edition.name, from: newest?.slug ?? null },
    });
    return edition;
  });
}

/** Publishes a draft: from now on the database refuses every change to it. */
export async function publishEdition({
  teamId,
  gameId,
  editionId,
  actorId,
  now = new Date(),
}: {
  teamId: number;
  gameId: number;
  editionId: number;
  actorId: string;
  now?: Date;
}): Promise<EditionDto> {
  return getDb().transaction(async (tx) => {
    const draft = await lockDraft(tx, gameId, editionId);
    await tx
      .update(editions)
      .set({ status: "published", publishedAt: now, version: sql`${editions.version} + 1` })
      .where(eq(editions.id, editionId));
    await recordAudit(tx, {
      teamId,
      actorId,
      action: "edition.published",
      detail: { edition: draft.slug, name: draft.name },
    });
    return { ...draft, status: "published", version: draft.version + 1 };
  });
}

async function insertEdition(tx: Tx, gameId: number, fields: Omit<NewEdition, "notes"> & { notes?: string | null }) {
  const slug = await freeSlug(
    async (s) =>
      (
        await tx
          .select({ id: editions.id })
          .from(editions)
          .where(and(eq(editions.gameId, gameId), eq(editions.slug, s)))
      ).length > 0,
    fields.name,
    "edition",
  );
  const releasedOn = fields.releasedOn ? new Date(`${fields.releasedOn}T00:00:00Z`) : new Date();
  const [made] = await tx
    .insert(editions)
    .values({ gameId, slug, name: fields.name, releasedOn, notes: fields.notes ?? null })
    .$returningId();
  const [row] = await tx.select().from(editions).where(eq(editions.id, made!.id));
  return toDto(row!);
}

/**
 * Copies an Edition's stances, moves and edges into another, set by set, in their order: each
 * row's references (a move's stance, an edge's ends) are found again in the copy by character and key.
 */
async function copyEdition(tx: Tx, from: number, to: number): Promise<void> {
  await tx.execute(sql`
    insert into ${stances} (edition_id, character_id, \`key\`, name, abbreviation, notes)
    select ${to}, character_id, \`key\`, name, abbreviation, notes from ${stances} where edition_id = ${from} order by id`);
  await tx.execute(sql`
    insert into ${moves} (edition_id, character_id, \`key\`, input, name, level, damage, startup, on_block, on_hit,
      on_counter_hit, \`range\`, tags, notes, from_posture, stance_id, sort)
    select ${to}, m.character_id, m.\`key\`, m.input, m.name, m.level, m.damage, m.startup, m.on_block, m.on_hit,
      m.on_counter_hit, m.\`range\`, m.tags, m.notes, m.from_posture, ns.id, m.sort
    from ${moves} m
    left join ${stances} os on os.id = m.stance_id
    left join ${stances} ns on ns.edition_id = ${to} and ns.character_id = os.character_id and ns.\`key\` = os.\`key\`
    where m.edition_id = ${from} order by m.id`);
  await tx.execute(sql`
    insert into ${edges} (edition_id, character_id, \`key\`, kind, from_move_id, from_stance_id, to_move_id, to_stance_id,
      input, gap_on_block, combo_on_hit, combo_on_counter_hit, on_block, on_hit, on_counter_hit, auto_guard)
    select ${to}, e.character_id, e.\`key\`, e.kind, nfm.id, nfs.id, ntm.id, nts.id,
      e.input, e.gap_on_block, e.combo_on_hit, e.combo_on_counter_hit, e.on_block, e.on_hit, e.on_counter_hit, e.auto_guard
    from ${edges} e
    left join ${moves} ofm on ofm.id = e.from_move_id
    left join ${moves} nfm on nfm.edition_id = ${to} and nfm.character_id = ofm.character_id and nfm.\`key\` = ofm.\`key\`
    left join ${stances} ofs on ofs.id = e.from_stance_id
    left join ${stances} nfs on nfs.edition_id = ${to} and nfs.character_id = ofs.character_id and nfs.\`key\` = ofs.\`key\`
    left join ${moves} otm on otm.id = e.to_move_id
    left join ${moves} ntm on ntm.edition_id = ${to} and ntm.character_id = otm.character_id and ntm.\`key\` = otm.\`key\`
    left join ${stances} ots on ots.id = e.to_stance_id
    left join ${stances} nts on nts.edition_id = ${to} and nts.character_id = ots.character_id and nts.\`key\` = ots.\`key\`
    where e.edition_id = ${from} order by e.id`);
}

function toDto(row: typeof editions.$inferSelect): EditionDto {
  return {
    id: row.id,
    slug: row.slug,
    name: row.name,
    releasedOn: day(row.releasedOn),
    status: row.status,
    version: row.version,
  };
}
