import "server-only";
import { env } from "@/env";
import { accountExistsMail, confirmAddressMail, deliverSoon, passwordResetMail, queueMail } from "@/server/mail";
import { getDb } from "@/server/db";
import { createPasswordAccount, createPasswordReset, renewEmailConfirmation } from "./queries";

/**
 * The parts of sign-up, password reset and "send the link again" that depend on whether an
 * account exists. The actions answer first, the same for every address, and run these after
 * the answer (`afterAnswer`), so neither the answer nor its timing says which addresses have
 * accounts; only the mail, which reaches the address's owner alone, differs.
 */

export const CONFIRM_EXPIRES_HOURS = 24;
export const RESET_EXPIRES_MINUTES = 30;

/** An address on this site, for a link in a mail. */
function siteUrl(path: string, params: Record<string, string> = {}): string {
  const url = new URL(path, env().NEXTAUTH_URL);
  for (const [key, value] of Object.entries(params)) url.searchParams.set(key, value);
  return url.toString();
}

/** Where a confirmation link leads: the confirm page, carrying where to go once signed in. */
const confirmationMail = (callbackUrl: string) => (token: string) =>
  confirmAddressMail({
    url: siteUrl("/confirm-email", callbackUrl === "/" ? { token } : { token, callbackUrl }),
    expiresInHours: CONFIRM_EXPIRES_HOURS,
  });

/**
 * A new address gets an unproven account and a confirmation link; an address that already has
 * an account gets a note pointing to sign-in instead, and the account is left as it was.
 */
export async function finishSignUp({
  name,
  email,
  passwordHash,
  callbackUrl,
}: {
  name: string;
  email: string;
  passwordHash: string;
  callbackUrl: string;
}): Promise<void> {
  const created = await createPasswordAccount({
    email,
    name,
    passwordHash,
    expiresInHours: CONFIRM_EXPIRES_HOURS,
    mail: confirmationMail(callbackUrl),
  });
  if (!created) await queueMail(getDb(), { to: email, ...accountExistsMail({ url: siteUrl("/sign-in") }) });
  deliverSoon();
}

/** A reset link to the account with this address; nothing for an unknown one. */
export async function sendPasswordReset({ email }: { email: string }): Promise<void> {
  const queued = await createPasswordReset({
    email,
    expiresInMinutes: RESET_EXPIRES_MINUTES,
    mail: (token) =>
      passwordResetMail({ url: siteUrl("/reset-password", { token }), expiresInMinutes: RESET_EXPIRES_MINUTES }),
  });
  if (queued) deliverSoon();
}

/** A new confirmation link, for a password account still waiting for one; nothing otherwise. */
export async function sendNewConfirmation({ email, callbackUrl }: { email: string; callbackUrl: string }) {
  const queued = await renewEmailConfirmation({
    email,
    expiresInHours: CONFIRM_EXPIRES_HOURS,
    mail: confirmationMail(callbackUrl),
  });
  if (queued) deliverSoon();
}
