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
  primaryKey,
  smallint,
  text,
  uniqueIndex,
  varchar,
  type AnyMySqlColumn,
} from "drizzle-orm/mysql-core";
import type { BoardDocument, BoardOrigin } from "@/lib/board";
import type { Level, Outcome } from "@/lib/engine";
import { PERMALINK_VISIBILITIES } from "@/lib/permalink";
import { RANGE_KINDS } from "@/lib/engine/range";
import { ROLES } from "@/lib/roles";

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
/** A draft Edition is edited; publishing freezes it for good (triggers refuse writes to its rows). */
export const EDITION_STATUSES = ["draft", "published"] as const;

/** A row's version, for saves based on what the editor last read: a save of an older version is refused. */
const version = () => int("version").notNull().default(1);

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
    /** How the game measures a move's range: free labels, or numbers in `rangeUnit`. */
    rangeKind: mysqlEnum("range_kind", RANGE_KINDS).notNull().default("label"),
    /** The unit of a numeric range (e.g. "m"); null when ranges are labels. */
    rangeUnit: varchar("range_unit", { length: 12 }),
    /** The team that owns the game; null for the public demo game, read-only to everyone. */
    teamId: ref("team_id").references((): AnyMySqlColumn => teams.id, { onDelete: "cascade" }),
    version: version(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("games_slug_uq").on(t.slug), index("games_team_idx").on(t.teamId)],
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
    status: mysqlEnum("status", EDITION_STATUSES).notNull().default("draft"),
    publishedAt: datetime("published_at", { mode: "date" }),
    version: version(),
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
    version: version(),
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
    version: version(),
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
    /** The whole notation to reach this hit, e.g. the demo's `n.v.r` or `drift:v`. */
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
    version: version(),
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
    version: version(),
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

// ---------------------------------------------------------------------------
// People, teams and sharing.
//
// users, accounts, sessions and verification_tokens have the shapes
// @auth/drizzle-adapter expects (its MySQL tables), under our own names; the
// adapter is given these tables, so sign-in links and users go through it.

export { ROLES, type Role } from "@/lib/roles";

/** A person who can sign in. The adapter creates users by e-mail; sign-up sets a password too. */
export const users = mysqlTable(
  "users",
  {
    id: varchar("id", { length: 255 })
      .primaryKey()
      .$defaultFn(() => crypto.randomUUID()),
    name: varchar("name", { length: 255 }),
    email: varchar("email", { length: 255 }).notNull(),
    emailVerified: datetime("email_verified", { mode: "date", fsp: 3 }),
    image: varchar("image", { length: 255 }),
    /** argon2id; null for people who only ever signed in by link. Never leaves the server. */
    passwordHash: varchar("password_hash", { length: 255 }),
    /**
     * Every session carries the version it was made under and ends when this moves on:
     * bumped by a password change or reset, "sign out everywhere", and a link sign-in
     * that voids a password set on an unproven address.
     */
    sessionVersion: int("session_version").notNull().default(0),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("users_email_uq").on(t.email)],
);

export const accounts = mysqlTable(
  "accounts",
  {
    userId: varchar("user_id", { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    type: varchar("type", { length: 255 }).$type<"email" | "oauth" | "oidc" | "webauthn">().notNull(),
    provider: varchar("provider", { length: 255 }).notNull(),
    providerAccountId: varchar("provider_account_id", { length: 255 }).notNull(),
    refresh_token: varchar("refresh_token", { length: 255 }),
    access_token: varchar("access_token", { length: 255 }),
    expires_at: int("expires_at"),
    token_type: varchar("token_type", { length: 255 }),
    scope: varchar("scope", { length: 255 }),
    id_token: varchar("id_token", { length: 2048 }),
    session_state: varchar("session_state", { length: 255 }),
  },
  (t) => [primaryKey({ columns: [t.provider, t.providerAccountId] }), index("accounts_user_idx").on(t.userId)],
);

export const sessions = mysqlTable("sessions", {
  sessionToken: varchar("session_token", { length: 255 }).primaryKey(),
  userId: varchar("user_id", { length: 255 })
    .notNull()
    .references(() => users.id, { onDelete: "cascade" }),
  expires: datetime("expires", { mode: "date" }).notNull(),
});

/** One-time sign-in links: the adapter stores the token hashed with the secret. */
export const verificationTokens = mysqlTable(
  "verification_tokens",
  {
    identifier: varchar("identifier", { length: 255 }).notNull(),
    token: varchar("token", { length: 255 }).notNull(),
    expires: datetime("expires", { mode: "date" }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.identifier, t.token] })],
);

/** Forgotten-password links: single use (usedAt), expiring, stored as a SHA-256 of the token. */
export const passwordResets = mysqlTable(
  "password_resets",
  {
    id: id(),
    userId: varchar("user_id", { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    tokenHash: varchar("token_hash", { length: 64 }).notNull(),
    expiresAt: datetime("expires_at", { mode: "date" }).notNull(),
    usedAt: datetime("used_at", { mode: "date" }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("password_resets_token_uq").on(t.tokenHash), index("password_resets_user_idx").on(t.userId)],
);

/** Links that prove a new password account's address: single use, expiring, stored as a SHA-256 of the token. */
export const emailConfirmations = mysqlTable(
  "email_confirmations",
  {
    id: id(),
    userId: varchar("user_id", { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    tokenHash: varchar("token_hash", { length: 64 }).notNull(),
    expiresAt: datetime("expires_at", { mode: "date" }).notNull(),
    usedAt: datetime("used_at", { mode: "date" }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("email_confirmations_token_uq").on(t.tokenHash),
    index("email_confirmations_user_idx").on(t.userId),
  ],
);

export const teams = mysqlTable(
  "teams",
  {
    id: id(),
    slug: varchar("slug", { length: 64 }).notNull(),
    name: varchar("name", { length: 120 }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("teams_slug_uq").on(t.slug)],
);

/** A user's place in a team: one role each. */
export const memberships = mysqlTable(
  "memberships",
  {
    teamId: ref("team_id")
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    userId: varchar("user_id", { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    role: mysqlEnum("role", ROLES).notNull(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.teamId, t.userId] }), index("memberships_user_idx").on(t.userId)],
);

/** An invitation by e-mail: the link's token is stored as a SHA-256, single use, expiring. */
export const invites = mysqlTable(
  "invites",
  {
    id: id(),
    teamId: ref("team_id")
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    email: varchar("email", { length: 255 }).notNull(),
    role: mysqlEnum("role", ROLES).notNull(),
    tokenHash: varchar("token_hash", { length: 64 }).notNull(),
    invitedBy: varchar("invited_by", { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    expiresAt: datetime("expires_at", { mode: "date" }).notNull(),
    acceptedAt: datetime("accepted_at", { mode: "date" }),
    acceptedBy: varchar("accepted_by", { length: 255 }).references(() => users.id, { onDelete: "set null" }),
    revokedAt: datetime("revoked_at", { mode: "date" }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("invites_token_uq").on(t.tokenHash), index("invites_team_idx").on(t.teamId)],
);

/** A shared view, pinned to the edition it was made on. */
export const permalinks = mysqlTable(
  "permalinks",
  {
    id: id(),
    /** base64url of 18 random bytes (144 bits). */
    slug: varchar("slug", { length: 32 }).notNull(),
    teamId: ref("team_id")
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    createdBy: varchar("created_by", { length: 255 })
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    kind: varchar("kind", { length: 16 }).notNull().default("explorer"),
    visibility: mysqlEnum("visibility", PERMALINK_VISIBILITIES).notNull(),
    editionId: ref("edition_id")
      .notNull()
      .references(() => editions.id, { onDelete: "cascade" }),
    characterId: ref("character_id")
      .notNull()
      .references(() => characters.id, { onDelete: "cascade" }),
    /** The view: root, selected path and options, validated by the permalink schema on the way in and out. */
    view: json("view").$type<Record<string, unknown>>().notNull(),
    title: varchar("title", { length: 200 }).notNull(),
    revokedAt: datetime("revoked_at", { mode: "date" }),
    revokedBy: varchar("revoked_by", { length: 255 }).references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("permalinks_slug_uq").on(t.slug), index("permalinks_team_idx").on(t.teamId, t.createdAt)],
);

/**
 * A team's Mix-up board: a tree of situations (attacker options x defender options), made
 * for one character in one Edition (draft or published), optionally against an opponent.
 * The document is checked by `boardDocumentSchema` on the way in; `version` is the editor's
 * base for a save (a save of an older version is refused).
 */
export const boards = mysqlTable(
  "boards",
  {
    id: id(),
    teamId: ref("team_id")
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    editionId: ref("edition_id")
      .notNull()
      .references(() => editions.id, { onDelete: "cascade" }),
    characterId: ref("character_id")
      .notNull()
      .references(() => characters.id, { onDelete: "cascade" }),
    opponentId: ref("opponent_id").references(() => characters.id, { onDelete: "set null" }),
    title: varchar("title", { length: 120 }).notNull(),
    document: json("document").$type<BoardDocument>().notNull(),
    origin: json("origin").$type<BoardOrigin>(),
    version: version(),
    createdBy: varchar("created_by", { length: 255 }).references(() => users.id, { onDelete: "set null" }),
    updatedBy: varchar("updated_by", { length: 255 }).references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
    /** Microseconds, so the list's "last saved first" holds for saves within one second. */
    updatedAt: datetime("updated_at", { mode: "date", fsp: 6 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(6)`),
  },
  (t) => [index("boards_team_updated_idx").on(t.teamId, t.updatedAt)],
);

/** Who changed what in a team, newest last. */
export const auditLog = mysqlTable(
  "audit_log",
  {
    id: id(),
    teamId: ref("team_id")
      .notNull()
      .references(() => teams.id, { onDelete: "cascade" }),
    actorId: varchar("actor_id", { length: 255 }).references(() => users.id, { onDelete: "set null" }),
    action: varchar("action", { length: 64 }).notNull(),
    /** What the action was about, as plain data (no secrets). */
    detail: json("detail").$type<Record<string, unknown>>().notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("audit_log_team_idx").on(t.teamId, t.createdAt)],
);

/**
 * Mail waiting to go out. Written in the transaction that decides to send it and sent
 * after the commit by a drain step, retried with a growing wait until `sentAt` is set,
 * so a slow mail server never holds a database connection and no mail is lost.
 */
export const mailOutbox = mysqlTable(
  "mail_outbox",
  {
    id: id(),
    to: varchar("to_address", { length: 255 }).notNull(),
    subject: varchar("subject", { length: 255 }).notNull(),
    text: text("text").notNull(),
    html: text("html").notNull(),
    attempts: int("attempts").notNull().default(0),
    nextAttemptAt: datetime("next_attempt_at", { mode: "date" })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP`),
    sentAt: datetime("sent_at", { mode: "date" }),
    lastError: varchar("last_error", { length: 500 }),
    createdAt: createdAt(),
  },
  (t) => [index("mail_outbox_due_idx").on(t.sentAt, t.nextAttemptAt)],
);

/** rate-limiter-flexible's MySQL store, created here so migrations own every table. */
export const rateLimits = mysqlTable("rate_limits", {
  key: varchar("key", { length: 255 }).primaryKey(),
  points: int("points").notNull().default(0),
  expire: bigint("expire", { mode: "number", unsigned: true }),
});

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
export type User = typeof users.$inferSelect;
export type NewUser = typeof users.$inferInsert;
export type Team = typeof teams.$inferSelect;
export type NewTeam = typeof teams.$inferInsert;
export type Membership = typeof memberships.$inferSelect;
export type NewMembership = typeof memberships.$inferInsert;
export type Invite = typeof invites.$inferSelect;
export type NewInvite = typeof invites.$inferInsert;
export type Permalink = typeof permalinks.$inferSelect;
export type NewPermalink = typeof permalinks.$inferInsert;
export type BoardRow = typeof boards.$inferSelect;
export type NewBoardRow = typeof boards.$inferInsert;
export type AuditEntry = typeof auditLog.$inferSelect;
export type NewAuditEntry = typeof auditLog.$inferInsert;
