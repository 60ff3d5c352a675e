import { cleanName } from "@/lib/names";

/**
 * The e-mails Framefork sends. Each returns both parts of a multipart
 * message; every value put into the HTML goes through `escapeHtml`, since
 * names and team names are typed by users. Names also go through `cleanName`:
 * rows written before names were checked may hold line breaks or
 * text-direction characters, which must not reach a subject or a sentence.
 */
export interface MailContent {
  subject: string;
  text: string;
  html: string;
}

const HTML_ESCAPES: Record<string, string> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" };

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => HTML_ESCAPES[c] ?? c);
}

/** The shared frame: a heading, paragraphs, one button-like link and a closing note. */
function layout({
  heading,
  paragraphs,
  action,
  url,
  footnote,
}: {
  heading: string;
  paragraphs: string[];
  action: string;
  url: string;
  footnote: string;
}): string {
  const p = (s: string) => `<p style="margin:0 0 16px;line-height:1.5">${escapeHtml(s)}</p>`;
  return `<!doctype html>
<html lang="en"><body style="margin:0;padding:24px;background:#f4f5f7;font-family:system-ui,sans-serif;color:#14161c">
<div style="max-width:520px;margin:0 auto;background:#ffffff;border-radius:8px;padding:24px">
<p style="margin:0 0 16px;font-weight:700;color:#b4561b">Framefork</p>
<h1 style="margin:0 0 16px;font-size:20px">${escapeHtml(heading)}</h1>
${paragraphs.map(p).join("\n")}
<p style="margin:0 0 16px"><a href="${escapeHtml(url)}" style="display:inline-block;background:#14161c;color:#ffffff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(action)}</a></p>
<p style="margin:0 0 16px;font-size:13px;color:#555b66;word-break:break-all">Or paste this address into your browser: ${escapeHtml(url)}</p>
<p style="margin:0;font-size:13px;color:#555b66">${escapeHtml(footnote)}</p>
</div></body></html>`;
}

function text(lines: string[]): string {
  return `${lines.join("\n\n")}\n\n— Framefork\n`;
}

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? "" : "s"}`;

export function signInLinkMail({ url }: { url: string }): MailContent {
  const subject = "Your Framefork sign-in link";
  const footnote = "The link works once and expires in 24 hours. If you did not ask for it, ignore this e-mail.";
  return {
    subject,
    text: text(["Open this link to sign in to Framefork:", url, footnote]),
    html: layout({
      heading: "Sign in to Framefork",
      paragraphs: ["Open the link below to sign in."],
      action: "Sign in",
      url,
      footnote,
    }),
  };
}

export function passwordResetMail({ url, expiresInMinutes }: { url: string; expiresInMinutes: number }): MailContent {
  const footnote = `The link works once and expires in ${plural(expiresInMinutes, "minute")}. If you did not ask for it, ignore this e-mail: your password stays as it is.`;
  return {
    subject: "Reset your Framefork password",
    text: text([
      "Someone (hopefully you) asked to reset your Framefork password. Choose a new one here:",
      url,
      footnote,
    ]),
    html: layout({
      heading: "Choose a new password",
      paragraphs: ["Someone (hopefully you) asked to reset your Framefork password."],
      action: "Choose a new password",
      url,
      footnote,
    }),
  };
}

/** Sent at sign-up: the link proves the address before the password works. */
export function confirmAddressMail({ url, expiresInHours }: { url: string; expiresInHours: number }): MailContent {
  const footnote = `The link works once and expires in ${plural(expiresInHours, "hour")}. If you did not create a Framefork account, do not open it: without it the account cannot be used.`;
  return {
    subject: "Confirm your e-mail address for Framefork",
    text: text([
      "Someone (hopefully you) created a Framefork account with this e-mail address. Confirm the address to start using it:",
      url,
      footnote,
    ]),
    html: layout({
      heading: "Confirm your e-mail address",
      paragraphs: [
        "Someone (hopefully you) created a Framefork account with this e-mail address. Confirm the address to start using it.",
      ],
      action: "Confirm my address",
      url,
      footnote,
    }),
  };
}

/**
 * Sent instead of a confirmation when someone signs up with an address that already has an
 * account: the sign-up page answers the same either way, and only the address's owner learns more.
 */
export function accountExistsMail({ url }: { url: string }): MailContent {
  const lines = [
    "Someone (hopefully you) tried to create a Framefork account with this e-mail address, but it already has one.",
    "To get in, open the sign-in page: you can sign in with your password, have a sign-in link e-mailed to you, or choose a new password with “Forgot your password?”.",
  ];
  const footnote = "If it was not you, ignore this e-mail: nothing was changed.";
  return {
    subject: "You already have a Framefork account",
    text: text([...lines, url, footnote]),
    html: layout({ heading: "You already have an account", paragraphs: lines, action: "Go to sign in", url, footnote }),
  };
}

export function inviteMail({
  teamName,
  inviterName,
  role,
  url,
  expiresInDays,
}: {
  teamName: string;
  inviterName: string;
  role: string;
  url: string;
  expiresInDays: number;
}): MailContent {
  const inviter = cleanName(inviterName) || "A team member";
  const team = cleanName(teamName) || "(no name)";
  const invitation = `${inviter} invited you to join the team ${team} on Framefork as a ${role}.`;
  const footnote = `The invitation expires in ${plural(expiresInDays, "day")}. If you did not expect it, ignore this e-mail.`;
  return {
    subject: `${inviter} invited you to ${team} on Framefork`,
    text: text([invitation, "Accept the invitation here:", url, footnote]),
    html: layout({
      heading: `Join ${team}`,
      paragraphs: [invitation],
      action: "Accept the invitation",
      url,
      footnote,
    }),
  };
}
