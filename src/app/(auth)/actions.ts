"use server";

import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { displayNameSchema } from "@/lib/names";
import { validatedAction, validatedActionWithUser } from "@/server/actions";
import { afterAnswer } from "@/server/after-answer";
import { finishSignUp, sendNewConfirmation, sendPasswordReset } from "@/server/auth/accounts";
import { hashPassword, newPasswordSchema, verifyPassword } from "@/server/auth/password";
import {
  endAllSessions,
  findUserById,
  updatePassword,
  useEmailConfirmation,
  usePasswordReset,
} from "@/server/auth/queries";
import { clientIp, consume, limitMail, passwordAttempt } from "@/server/auth/rate-limit";
import { emailSchema, safeCallbackUrl } from "@/server/auth/schemas";
import { endSessionHere, startSession } from "@/server/auth/session";

const ip = async () => clientIp(await headers());

/** Where to go once signed in, carried by the forms; anything but a path on this site means "/". */
const callbackUrlField = z
  .string()
  .max(2000)
  .optional()
  .transform((value) => safeCallbackUrl(value));

/**
 * Sign-up answers "check your e-mail" for every address, in the same time: the same work is
 * done before the answer for a new address and a taken one (limits, hashing the password), and
 * everything that depends on which it is runs after the answer (`finishSignUp`). A new address
 * gets an account that works once the e-mailed link proves the address; a taken one gets a
 * note to its owner, and its account is untouched.
 */
export const signUp = validatedAction(
  z.object({
    name: displayNameSchema,
    email: emailSchema,
    password: newPasswordSchema,
    callbackUrl: callbackUrlField,
  }),
  async ({ name, email, password, callbackUrl }) => {
    await consume([["signUpIp", await ip()]]);
    // Every sign-up mails the address once (a confirmation link, or a note to its owner).
    await limitMail("confirmAddress", email, await ip());
    const passwordHash = await hashPassword(password);
    afterAnswer("sign-up", () => finishSignUp({ name, email, passwordHash, callbackUrl }));
    redirect("/check-email?for=confirm");
  },
);

/** The same answer, in the same time, whether or not the account exists (see signUp). */
export const requestPasswordReset = validatedAction(z.object({ email: emailSchema }), async ({ email }) => {
  await limitMail("passwordReset", email, await ip());
  afterAnswer("password reset", () => sendPasswordReset({ email }));
  redirect("/check-email?for=reset");
});

/** "Send the link again" from the sign-in form: the same answer for every address (see signUp). */
export const resendConfirmation = validatedAction(
  z.object({ email: emailSchema, callbackUrl: callbackUrlField }),
  async ({ email, callbackUrl }) => {
    await limitMail("confirmAddress", email, await ip());
    afterAnswer("confirmation link", () => sendNewConfirmation({ email, callbackUrl }));
    return "If that address has an account waiting to be confirmed, we sent it a new link. It works once, for 24 hours.";
  },
);

const linkToken = z.string().min(1, { error: "This link is incomplete: open the one in the e-mail." }).max(200);

const CONFIRMATION_REFUSED = {
  used: ["conflict", "This link was already used: your address is confirmed. Sign in to continue."],
  expired: [
    "conflict",
    "This link has expired. Sign in with your e-mail and password, and we will offer to send a new one.",
  ],
  unknown: ["not_found", "This link is not valid: open the newest one we e-mailed you."],
} as const;

/**
 * Uses a confirmation link (a button on the page it opens, so a mail scanner fetching the link
 * does not use it up). The address is proven and the person who opened the mail is signed in,
 * as a sign-in link would do; the page then says so (a redirect: setting the session cookie
 * re-renders the page, where the used link would no longer show the form).
 */
export const confirmEmail = validatedAction(
  z.object({ token: linkToken, callbackUrl: callbackUrlField }),
  async ({ token, callbackUrl }) => {
    const used = await useEmailConfirmation({ token });
    if (used.state !== "valid") {
      const [code, message] = CONFIRMATION_REFUSED[used.state];
      throw new AppError(code, message);
    }
    await startSession(used.user);
    redirect(`/confirm-email?confirmed=1&callbackUrl=${encodeURIComponent(callbackUrl)}`);
  },
);

export const resetPassword = validatedAction(
  z.object({ token: linkToken, password: newPasswordSchema }),
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
    const sessionVersion = await updatePassword({ id: user.id, passwordHash: await hashPassword(newPassword) });
    // Every session made before has ended; this browser gets a new one from the server.
    await startSession({ ...user, sessionVersion });
    return "Your password is changed. You are still signed in here; everywhere else you are signed out.";
  },
);

/** Ends every session of the user, this one included. */
export const signOutEverywhere = validatedActionWithUser(z.object({}), async (_, user) => {
  await endAllSessions({ id: user.id });
  await endSessionHere();
  redirect("/sign-in?signedOut=everywhere");
});
