"use server";

import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { z } from "zod";
import { env } from "@/env";
import { AppError } from "@/lib/errors";
import { displayNameSchema } from "@/lib/names";
import { validatedAction, validatedActionWithUser } from "@/server/actions";
import { hashPassword, newPasswordSchema, verifyPassword } from "@/server/auth/password";
import {
  createPasswordReset,
  createUser,
  findUserByEmail,
  findUserById,
  updatePassword,
  usePasswordReset,
} from "@/server/auth/queries";
import { clientIp, consume, limitMail, passwordAttempt } from "@/server/auth/rate-limit";
import { emailSchema } from "@/server/auth/schemas";
import { passwordResetMail, sendMail } from "@/server/mail";

const RESET_EXPIRES_MINUTES = 30;

const ip = async () => clientIp(await headers());

export const signUp = validatedAction(
  z.object({
    name: displayNameSchema,
    email: emailSchema,
    password: newPasswordSchema,
  }),
  async ({ name, email, password }) => {
    await consume([["signUpIp", await ip()]]);
    const created = await createUser({ email, name, passwordHash: await hashPassword(password) });
    if (!created)
      throw new AppError(
        "conflict",
        "An account with this e-mail already exists. Sign in, or reset your password if you forgot it.",
      );
    return "Your account is ready.";
  },
);

export const requestPasswordReset = validatedAction(z.object({ email: emailSchema }), async ({ email }) => {
  await limitMail("passwordReset", email, await ip());
  const user = await findUserByEmail({ email });
  if (user) {
    const token = await createPasswordReset({ userId: user.id, expiresInMinutes: RESET_EXPIRES_MINUTES });
    const url = new URL("/reset-password", env().NEXTAUTH_URL);
    url.searchParams.set("token", token);
    await sendMail({
      to: user.email,
      ...passwordResetMail({ url: url.toString(), expiresInMinutes: RESET_EXPIRES_MINUTES }),
    });
  }
  // The same answer whether or not the account exists.
  redirect("/check-email?for=reset");
});

export const resetPassword = validatedAction(
  z.object({
    token: z.string().min(1, { error: "This link is incomplete: open the one in the e-mail." }).max(200),
    password: newPasswordSchema,
  }),
  async ({ token, password }) => {
    const state = await usePasswordReset({ token, passwordHash: await hashPassword(password) });
    if (state === "used") throw new AppError("conflict", "This reset link was already used. Ask for a new one.");
    if (state === "expired") throw new AppError("conflict", "This reset link has expired. Ask for a new one.");
    if (state === "unknown") throw new AppError("not_found", "This reset link is not valid. Ask for a new one.");
    return "Your password is changed. Sign in with the new one.";
  },
);

export const changePassword = validatedActionWithUser(
  z.object({
    currentPassword: z.string().min(1, { error: "Enter your current password." }).max(1000),
    newPassword: newPasswordSchema,
  }),
  async ({ currentPassword, newPassword }, user) => {
    const attempt = await passwordAttempt(user.email, await ip());
    const row = await findUserById({ id: user.id });
    if (!row) throw new AppError("unauthorized", "Sign in to do this.");
    if (!row.passwordHash)
      throw new AppError(
        "bad_request",
        "Your account has no password yet: set one with “Forgot your password?” on the sign-in page.",
      );
    if (!(await verifyPassword(row.passwordHash, currentPassword)))
      throw new AppError("bad_request", "Your current password is not right.");
    await attempt.succeeded();
    await updatePassword({ id: user.id, passwordHash: await hashPassword(newPassword) });
    return "Your password is changed.";
  },
);
