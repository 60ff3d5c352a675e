import "server-only";
import { env } from "@/env";
import type { Role } from "./db/schema";
import { sendMail } from "./mail";
import { inviteMail } from "./mail/templates";

/** The link in an invite e-mail. */
export function inviteLink(token: string): string {
  return new URL(`/invites/${encodeURIComponent(token)}`, env().NEXTAUTH_URL).toString();
}

export async function sendInviteMail({
  to,
  ...content
}: {
  to: string;
  teamName: string;
  inviterName: string;
  role: Role;
  url: string;
  expiresInDays: number;
}) {
  await sendMail({ to, ...inviteMail(content) });
}
