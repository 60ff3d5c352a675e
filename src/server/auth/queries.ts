import "server-only";
import { randomUUID } from "node:crypto";
import { and, eq, gt, isNotNull, isNull, sql, type SQL } from "drizzle-orm";
import { getDb } from "@/server/db";
import type { Executor } from "@/server/db/queries/audit";
import { emailConfirmations, passwordResets, users } from "@/server/db/schema";
import type { MailContent } from "@/server/mail";
import { queueMail } from "@/server/mail/outbox";
import { hashToken, newToken } from "@/server/tokens";

/** What the auth code may know about a user: never leaves the server with the hash in it. */
export interface UserWithHash {
  id: string;
  email: string;
  name: string | null;
  passwordHash: string | null;
  /** When the address was proven (an e-mailed link was used); null until then. */
  emailVerified: Date | null;
  /** Sessions made under another version have ended (see `users.sessionVersion`). */
  sessionVersion: number;
}

async function findUser(where: SQL): Promise<UserWithHash | null> {
  const [row] = await getDb()
    .select({
      id: users.id,
      email: users.email,
      name: users.name,
      passwordHash: users.passwordHash,
      emailVerified: users.emailVerified,
      sessionVersion: users.sessionVersion,
    })
    .from(users)
    .where(where)
    .limit(1);
  return row ?? null;
}

export const findUserByEmail = ({ email }: { email: string }) => findUser(eq(users.email, email));

export const findUserById = ({ id }: { id: string }) => findUser(eq(users.id, id));

const isDuplicate = (error: unknown): boolean =>
  (error as { cause?: { code?: string }; code?: string }).cause?.code === "ER_DUP_ENTRY" ||
  (error as { code?: string }).code === "ER_DUP_ENTRY";

/** Keeps the first moment the address was proven. */
const proven = () => sql`coalesce(${users.emailVerified}, ${new Date()})`;

/** The next session version, written in SQL so two changes at once both count. */
const nextVersion = sql`${users.sessionVersion} + 1`;

/** Writes a single-use confirmation link for the user and queues its mail, in the caller's transaction. */
async function queueConfirmation(
  tx: Executor,
  { userId, email, expiresInHours, mail }: ConfirmationArgs & { userId: string; email: string },
): Promise<void> {
  const token = newToken();
  await tx
    .insert(emailConfirmations)
    .values({ userId, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + expiresInHours * 3_600_000) });
  await queueMail(tx, { to: email, ...mail(token) });
}

interface ConfirmationArgs {
  expiresInHours: number;
  /** The mail carrying the link, given the token (only its SHA-256 is stored). */
  mail: (token: string) => MailContent;
}

/**
 * Creates a password account whose address is not proven yet, with its confirmation link and
 * mail, in one transaction; false when the e-mail is taken (the unique index decides, so two
 * racing sign-ups cannot both win, and the loser leaves no link or mail behind).
 */
export async function createPasswordAccount({
  email,
  name,
  passwordHash,
  ...confirmation
}: { email: string; name: string; passwordHash: string } & ConfirmationArgs): Promise<boolean> {
  try {
    await getDb().transaction(async (tx) => {
      const id = randomUUID();
      await tx.insert(users).values({ id, email, name, passwordHash });
      await queueConfirmation(tx, { userId: id, email, ...confirmation });
    });
    return true;
  } catch (error) {
    if (isDuplicate(error)) return false;
    throw error;
  }
}

/**
 * Sends a new confirmation link to a password account still waiting for one; false (and nothing
 * sent) for an unknown address, a proven one, or an account without a password.
 */
export async function renewEmailConfirmation({
  email,
  ...confirmation
}: { email: string } & ConfirmationArgs): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const [user] = await tx
      .select({ id: users.id, email: users.email })
      .from(users)
      .where(and(eq(users.email, email), isNull(users.emailVerified), isNotNull(users.passwordHash)))
      .for("update");
    if (!user) return false;
    await queueConfirmation(tx, { userId: user.id, email: user.email, ...confirmation });
    return true;
  });
}

/**
 * Sets the new password and ends every session made before (the version moves on); returns the
 * new version, so the browser that made the change can be given a session under it.
 */
export async function updatePassword({ id, passwordHash }: { id: string; passwordHash: string }): Promise<number> {
  return getDb().transaction(async (tx) => {
    await tx.update(users).set({ passwordHash, sessionVersion: nextVersion }).where(eq(users.id, id));
    const [row] = await tx.select({ version: users.sessionVersion }).from(users).where(eq(users.id, id));
    return row?.version ?? 0;
  });
}

/** "Sign out everywhere": every session of the user ends at its next request. */
export async function endAllSessions({ id }: { id: string }): Promise<void> {
  const db = getDb();
  await db.update(users).set({ sessionVersion: nextVersion }).where(eq(users.id, id));
}

/**
 * A sign-in by e-mailed link proves the address. If the account behind it has a password but the
 * address was never proven, whoever chose that password never showed they own the address: the
 * password is voided, every session made with it ends, and pending confirmation links stop
 * working. True when that happened.
 */
export async function voidUnprovenPassword({ email }: { email: string }): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const [user] = await tx
      .select({ id: users.id })
      .from(users)
      .where(and(eq(users.email, email), isNull(users.emailVerified), isNotNull(users.passwordHash)))
      .for("update");
    if (!user) return false;
    await tx.update(users).set({ passwordHash: null, sessionVersion: nextVersion }).where(eq(users.id, user.id));
    await voidConfirmations(tx, user.id);
    return true;
  });
}

async function voidConfirmations(tx: Executor, userId: string): Promise<void> {
  await tx
    .update(emailConfirmations)
    .set({ usedAt: new Date() })
    .where(and(eq(emailConfirmations.userId, userId), isNull(emailConfirmations.usedAt)));
}

/**
 * A new single-use reset link for the account with this address, and its mail, in one
 * transaction; false (nothing written) when no account has the address. Only the token's
 * SHA-256 is stored.
 */
export async function createPasswordReset({
  email,
  expiresInMinutes,
  mail,
}: {
  email: string;
  expiresInMinutes: number;
  mail: (token: string) => MailContent;
}): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const [user] = await tx.select({ id: users.id, email: users.email }).from(users).where(eq(users.email, email));
    if (!user) return false;
    const token = newToken();
    await tx.insert(passwordResets).values({
      userId: user.id,
      tokenHash: hashToken(token),
      expiresAt: new Date(Date.now() + expiresInMinutes * 60_000),
    });
    await queueMail(tx, { to: user.email, ...mail(token) });
    return true;
  });
}

/** The state of a single-use e-mailed link (a reset or a confirmation). */
export type LinkState = "valid" | "expired" | "used" | "unknown";

type LinkTable = typeof passwordResets | typeof emailConfirmations;

function stateOf(row: { expiresAt: Date; usedAt: Date | null } | undefined): LinkState {
  if (!row) return "unknown";
  if (row.usedAt) return "used";
  if (row.expiresAt.getTime() <= Date.now()) return "expired";
  return "valid";
}

async function linkState(table: LinkTable, token: string): Promise<LinkState> {
  const [row] = await getDb()
    .select({ expiresAt: table.expiresAt, usedAt: table.usedAt })
    .from(table)
    .where(eq(table.tokenHash, hashToken(token)))
    .limit(1);
  return stateOf(row);
}

export const resetTokenState = ({ token }: { token: string }) => linkState(passwordResets, token);

export const confirmationState = ({ token }: { token: string }) => linkState(emailConfirmations, token);

/**
 * Claims a single-use link inside a transaction: the update only matches an unused, unexpired
 * token, so two submissions of the same link cannot both succeed. Returns the user it was for,
 * or why it cannot be used.
 */
async function claimLink(
  tx: Executor,
  table: LinkTable,
  token: string,
): Promise<{ state: "valid"; userId: string } | { state: Exclude<LinkState, "valid"> }> {
  const tokenHash = hashToken(token);
  const [claimed] = await tx
    .update(table)
    .set({ usedAt: new Date() })
    .where(and(eq(table.tokenHash, tokenHash), isNull(table.usedAt), gt(table.expiresAt, new Date())));
  const [row] = await tx
    .select({ userId: table.userId, expiresAt: table.expiresAt, usedAt: table.usedAt })
    .from(table)
    .where(eq(table.tokenHash, tokenHash))
    .limit(1);
  if (claimed.affectedRows === 1 && row) return { state: "valid", userId: row.userId };
  const state = stateOf(row);
  return { state: state === "valid" ? "expired" : state };
}

/**
 * Uses a reset token and sets the new password in one transaction. The link was e-mailed to the
 * address, so using it also proves the address; every session made before ends.
 */
export async function usePasswordReset({
  token,
  passwordHash,
}: {
  token: string;
  passwordHash: string;
}): Promise<LinkState> {
  return getDb().transaction(async (tx) => {
    const claim = await claimLink(tx, passwordResets, token);
    if (claim.state !== "valid") return claim.state;
    await tx
      .update(users)
      .set({ passwordHash, sessionVersion: nextVersion, emailVerified: proven() })
      .where(eq(users.id, claim.userId));
    // Other links sent to this account stop working once one was used.
    await tx
      .update(passwordResets)
      .set({ usedAt: new Date() })
      .where(and(eq(passwordResets.userId, claim.userId), isNull(passwordResets.usedAt)));
    await voidConfirmations(tx, claim.userId);
    return "valid";
  });
}

/** Who a confirmed account belongs to, for the session the confirmation starts. */
export interface ConfirmedUser {
  id: string;
  email: string;
  name: string | null;
  sessionVersion: number;
}

/**
 * Uses a confirmation link: the address is proven from now on, and the account's other
 * confirmation links stop working.
 */
export async function useEmailConfirmation({
  token,
}: {
  token: string;
}): Promise<{ state: "valid"; user: ConfirmedUser } | { state: Exclude<LinkState, "valid"> }> {
  return getDb().transaction(async (tx) => {
    const claim = await claimLink(tx, emailConfirmations, token);
    if (claim.state !== "valid") return claim;
    await tx.update(users).set({ emailVerified: proven() }).where(eq(users.id, claim.userId));
    await voidConfirmations(tx, claim.userId);
    const [user] = await tx
      .select({ id: users.id, email: users.email, name: users.name, sessionVersion: users.sessionVersion })
      .from(users)
      .where(eq(users.id, claim.userId));
    return user ? { state: "valid" as const, user } : { state: "unknown" as const };
  });
}
