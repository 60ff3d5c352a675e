import "server-only";
import { and, eq, gt, isNull, type SQL } from "drizzle-orm";
import { getDb } from "@/server/db";
import { passwordResets, users } from "@/server/db/schema";
import { hashToken, newToken } from "@/server/tokens";

/** What the auth code may know about a user: never leaves the server with the hash in it. */
export interface UserWithHash {
  id: string;
  email: string;
  name: string | null;
  passwordHash: string | null;
}

async function findUser(where: SQL): Promise<UserWithHash | null> {
  const [row] = await getDb()
    .select({ id: users.id, email: users.email, name: users.name, passwordHash: users.passwordHash })
    .from(users)
    .where(where)
    .limit(1);
  return row ?? null;
}

export const findUserByEmail = ({ email }: { email: string }) => findUser(eq(users.email, email));

export const findUserById = ({ id }: { id: string }) => findUser(eq(users.id, id));

/** Creates a password account; false when the e-mail is taken (the unique index decides, so two racing sign-ups cannot both win). */
export async function createUser({
  email,
  name,
  passwordHash,
}: {
  email: string;
  name: string;
  passwordHash: string;
}): Promise<boolean> {
  try {
    await getDb().insert(users).values({ email, name, passwordHash });
    return true;
  } catch (error) {
    if (
      (error as { cause?: { code?: string }; code?: string }).cause?.code === "ER_DUP_ENTRY" ||
      (error as { code?: string }).code === "ER_DUP_ENTRY"
    ) {
      return false;
    }
    throw error;
  }
}

export async function updatePassword({ id, passwordHash }: { id: string; passwordHash: string }): Promise<void> {
  const db = getDb();
  await db.update(users).set({ passwordHash }).where(eq(users.id, id));
}

/** A new single-use reset token; only its SHA-256 is stored. Returns the token for the e-mail. */
export async function createPasswordReset({
  userId,
  expiresInMinutes,
}: {
  userId: string;
  expiresInMinutes: number;
}): Promise<string> {
  const token = newToken();
  await getDb()
    .insert(passwordResets)
    .values({ userId, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + expiresInMinutes * 60_000) });
  return token;
}

export type ResetTokenState = "valid" | "expired" | "used" | "unknown";

export async function resetTokenState({ token }: { token: string }): Promise<ResetTokenState> {
  const [row] = await getDb()
    .select({ expiresAt: passwordResets.expiresAt, usedAt: passwordResets.usedAt })
    .from(passwordResets)
    .where(eq(passwordResets.tokenHash, hashToken(token)))
    .limit(1);
  if (!row) return "unknown";
  if (row.usedAt) return "used";
  if (row.expiresAt.getTime() <= Date.now()) return "expired";
  return "valid";
}

/**
 * Uses a reset token and sets the new password in one transaction: the row is
 * claimed by an update that only matches an unused, unexpired token, so two
 * submissions of the same link cannot both succeed.
 */
export async function usePasswordReset({
  token,
  passwordHash,
}: {
  token: string;
  passwordHash: string;
}): Promise<ResetTokenState> {
  const tokenHash = hashToken(token);
  return getDb().transaction(async (tx) => {
    const [claimed] = await tx
      .update(passwordResets)
      .set({ usedAt: new Date() })
      .where(
        and(
          eq(passwordResets.tokenHash, tokenHash),
          isNull(passwordResets.usedAt),
          gt(passwordResets.expiresAt, new Date()),
        ),
      );
    if (claimed.affectedRows !== 1) {
      const [row] = await tx
        .select({ usedAt: passwordResets.usedAt })
        .from(passwordResets)
        .where(eq(passwordResets.tokenHash, tokenHash))
        .limit(1);
      return row ? (row.usedAt ? "used" : "expired") : "unknown";
    }
    const [reset] = await tx
      .select({ userId: passwordResets.userId })
      .from(passwordResets)
      .where(eq(passwordResets.tokenHash, tokenHash))
      .limit(1);
    if (!reset) return "unknown";
    await tx.update(users).set({ passwordHash }).where(eq(users.id, reset.userId));
    // Other links sent to this account stop working once one was used.
    await tx
      .update(passwordResets)
      .set({ usedAt: new Date() })
      .where(and(eq(passwordResets.userId, reset.userId), isNull(passwordResets.usedAt)));
    return "valid";
  });
}
