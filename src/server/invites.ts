import "server-only";
import { env } from "@/env";
import { INVITE_DAYS, type InviteMailFacts } from "./db/queries/invites";
import type { OutgoingMail } from "./mail";
import { inviteMail } from "./mail/templates";

/** The link in an invite e-mail. */
export function inviteLink(token: string): string {
  return new URL(`/invites/${encodeURIComponent(token)}`, env().NEXTAUTH_URL).toString();
}

/** The invite e-mail for `createInvite`'s `mail`, which queues it with the invite. */
export function inviteMessage({ token, email, role, teamName, inviterName }: InviteMailFacts): OutgoingMail {
  return {
    to: email,
    ...inviteMail({ teamName, inviterName, role, url: inviteLink(token), expiresInDays: INVITE_DAYS }),
  };
}
