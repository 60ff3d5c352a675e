import { sql } from "drizzle-orm";
import {
  bigint,
  boolean,
  check,
  datetime,
  index,
  int,
  json,
  mysqlEnum,
  mysqlTable,
  smallint,
  text,
  uniqueIndex,
  varchar,
} from "drizzle-orm/mysql-core";
import type { Level, Outcome } from "@/lib/engine";

// MariaDB rejects Drizzle's `serial()` ("serial AUTO_INCREMENT"), so every
// key is an explicit unsigned bigint.
const id = () => bigint("id", { mode: "number", unsigned: true }).autoincrement().primaryKey();
const ref = (name: string) => bigint(name, { mode: "number", unsigned: true });
const createdAt = () =>
  datetime("created_at", { mode: "date" })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP`);

export const LEVELS = ["high", "mid", "low", "special-mid", "throw", "unblockable"] as const;
export const EDGE_KINDS = ["follow", "cancel", "enter"] as const;
/** Where a defender can do the move from: it decides which punishers apply after a high or a low. */
export const POSTURES = ["standing", "crouching", "any"] as const;

/** A game: its frame rate and the defaults the engine classifies with. */
export const games = mysqlTable(
  "games",
  {
    id: id(),
    slug: varchar("slug", { length: 64 }).notNull(),
    name: varchar("name", { length: 120 }).notNull(),
    summary: text("summary"),
    fps: smallint("fps", { unsigned: true }).notNull().default(60),
    /** Startup of the opponent's fastest attack, in frames. */
    fastest: smallint("fastest", { unsigned: true }).notNull().default(10),
    /** Block disadvantage from which a launching punish is assumed. */
    launchAt: smallint("launch_at", { unsigned: true }).notNull().default(15),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("games_slug_uq").on(t.slug)],
);

/** An edition is one version (patch) of a game's frame data. */
export const editions = mysqlTable(
  "editions",
  {
    id: id(),
    gameId: ref("game_id")
      .notNull()
      .references(() => games.id, { onDelete: "cascade" }),
    slug: varchar("slug", { length: 32 }).notNull(),
    name: varchar("name", { length: 120 }).notNull(),
    releasedOn: datetime("released_on", { mode: "date" }).notNull(),
    notes: text("notes"),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("editions_game_slug_uq").on(t.gameId, t.slug),
    index("editions_game_released_idx").on(t.gameId, t.releasedOn),
  ],
);

/** Characters belong to the game; their frame data belongs to an edition. */
export const characters = mysqlTable(
  "characters",
  {
    id: id(),
    gameId: ref("game_id")
      .notNull()
      .references(() => games.id, { onDelete: "cascade" }),
    slug: varchar("slug", { length: 64 }).notNull(),
    name: varchar("name", { length: 120 }).notNull(),
    summary: text("summary"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("characters_game_slug_uq").on(t.gameId, t.slug)],
);

export const stances = mysqlTable(
  "stances",
  {
    id: id(),
    editionId: ref("edition_id")
      .notNull()
      .references(() => editions.id, { onDelete: "cascade" }),
    characterId: ref("character_id")
      .notNull()
      .references(() => characters.id, { onDelete: "cascade" }),
    /** Stable across editions, so two editions of one stance can be compared. */
    key: varchar("key", { length: 64 }).notNull(),
    name: varchar("name", { length: 120 }).notNull(),
    abbreviation: varchar("abbreviation", { length: 12 }).notNull(),
    notes: text("notes"),
  },
  (t) => [uniqueIndex("stances_edition_character_key_uq").on(t.editionId, t.characterId, t.key)],
);

export const moves = mysqlTable(
  "moves",
  {
    id: id(),
    editionId: ref("edition_id")
      .notNull()
      .references(() => editions.id, { onDelete: "cascade" }),
    characterId: ref("character_id")
      .notNull()
      .references(() => characters.id, { onDelete: "cascade" }),
    /** Stable across editions. */
    key: varchar("key", { length: 64 }).notNull(),
    /** The whole notation to reach this hit, e.g. `1,2,4` or `DRF 3`. */
    input: varchar("input", { length: 64 }).notNull(),
    name: varchar("name", { length: 120 }).notNull(),
    level: mysqlEnum("level", LEVELS).notNull(),
    damage: smallint("damage", { unsigned: true }).notNull(),
    /** Startup for the first hit of a string or a stance move; null on later hits. */
    startup: smallint("startup", { unsigned: true }),
    onBlock: json("on_block").$type<Outcome>().notNull(),
    onHit: json("on_hit").$type<Outcome>().notNull(),
    onCounterHit: json("on_counter_hit").$type<Outcome>().notNull(),
    range: varchar("range", { length: 16 }),
    tags: json("tags").$type<string[]>().notNull(),
    notes: text("notes"),
    fromPosture: mysqlEnum("from_posture", POSTURES).notNull().default("standing"),
    /** The stance the move is done from (entered by an `enter` edge); null in neutral. */
    stanceId: ref("stance_id").references(() => stances.id, { onDelete: "set null" }),
    /** Order in the move list. */
    sort: int("sort").notNull().default(0),
  },
  (t) => [
    uniqueIndex("moves_edition_character_key_uq").on(t.editionId, t.characterId, t.key),
    index("moves_character_edition_sort_idx").on(t.characterId, t.editionId, t.sort),
  ],
);

/**
 * The graph's edges. `kind` decides which ends are used: follow (move → move),
 * cancel (move → stance), enter (stance → move); the CHECK constraints hold
 * the database to that.
 */
export const edges = mysqlTable(
  "edges",
  {
    id: id(),
    editionId: ref("edition_id")
      .notNull()
      .references(() => editions.id, { onDelete: "cascade" }),
    characterId: ref("character_id")
      .notNull()
      .references(() => characters.id, { onDelete: "cascade" }),
    key: varchar("key", { length: 96 }).notNull(),
    kind: mysqlEnum("kind", EDGE_KINDS).notNull(),
    fromMoveId: ref("from_move_id").references(() => moves.id, { onDelete: "cascade" }),
    fromStanceId: ref("from_stance_id").references(() => stances.id, { onDelete: "cascade" }),
    toMoveId: ref("to_move_id").references(() => moves.id, { onDelete: "cascade" }),
    toStanceId: ref("to_stance_id").references(() => stances.id, { onDelete: "cascade" }),
    /** What is entered to take the edge: `,2` after a hit, `~b` to cancel. */
    input: varchar("input", { length: 32 }).notNull(),
    /** follow: frames the defender is free before the next hit is active. */
    gapOnBlock: smallint("gap_on_block"),
    comboOnHit: boolean("combo_on_hit"),
    comboOnCounterHit: boolean("combo_on_counter_hit"),
    /** cancel: the outcome when the move is cancelled into the stance. */
    onBlock: json("on_block").$type<Outcome>(),
    onHit: json("on_hit").$type<Outcome>(),
    onCounterHit: json("on_counter_hit").$type<Outcome>(),
    autoGuard: json("auto_guard").$type<Level[]>(),
  },
  (t) => [
    uniqueIndex("edges_edition_character_key_uq").on(t.editionId, t.characterId, t.key),
    index("edges_character_edition_idx").on(t.characterId, t.editionId),
    check(
      "edges_follow_ends",
      sql`${t.kind} <> 'follow' or (${t.fromMoveId} is not null and ${t.toMoveId} is not null and ${t.fromStanceId} is null and ${t.toStanceId} is null and ${t.gapOnBlock} is not null and ${t.comboOnHit} is not null and ${t.comboOnCounterHit} is not null)`,
    ),
    check(
      "edges_cancel_ends",
      sql`${t.kind} <> 'cancel' or (${t.fromMoveId} is not null and ${t.toStanceId} is not null and ${t.fromStanceId} is null and ${t.toMoveId} is null and ${t.onBlock} is not null and ${t.onHit} is not null and ${t.onCounterHit} is not null and ${t.autoGuard} is not null)`,
    ),
    check(
      "edges_enter_ends",
      sql`${t.kind} <> 'enter' or (${t.fromStanceId} is not null and ${t.toMoveId} is not null and ${t.fromMoveId} is null and ${t.toStanceId} is null)`,
    ),
  ],
);

export type Game = typeof games.$inferSelect;
export type NewGame = typeof games.$inferInsert;
export type Edition = typeof editions.$inferSelect;
export type NewEdition = typeof editions.$inferInsert;
export type Character = typeof characters.$inferSelect;
export type NewCharacter = typeof characters.$inferInsert;
export type Stance = typeof stances.$inferSelect;
export type NewStance = typeof stances.$inferInsert;
export type Move = typeof moves.$inferSelect;
export type NewMove = typeof moves.$inferInsert;
export type Edge = typeof edges.$inferSelect;
export type NewEdge = typeof edges.$inferInsert;
