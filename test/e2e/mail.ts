import { expect } from "@playwright/test";

/** The test maildev's HTTP API (maildev 3: GET /api/email lists every message as JSON). */
const inbox = `http://127.0.0.1:${process.env.MAIL_WEB_PORT ?? "1181"}`;

export interface ReceivedMail {
  id: string;
  subject: string;
  text: string;
  html: string;
  to: { address: string }[];
}

async function mailTo(address: string): Promise<ReceivedMail[]> {
  const response = await fetch(`${inbox}/api/email`);
  if (!response.ok) throw new Error(`maildev answered ${response.status}: is it running on ${inbox}?`);
  const all = (await response.json()) as ReceivedMail[];
  return all.filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()));
}

/** Waits for the `count`-th message to `address` and returns it. */
export async function waitForMail(address: string, count = 1): Promise<ReceivedMail> {
  let found: ReceivedMail[] = [];
  await expect
    .poll(async () => (found = await mailTo(address)).length, { message: `mail to ${address}`, timeout: 15_000 })
    .toBeGreaterThanOrEqual(count);
  return found[count - 1]!;
}

/** Waits for a message to `address` whose subject starts with `subject`, and returns the newest. */
export async function waitForMailAbout(address: string, subject: string): Promise<ReceivedMail> {
  let found: ReceivedMail[] = [];
  await expect
    .poll(async () => (found = (await mailTo(address)).filter((m) => m.subject.startsWith(subject))).length, {
      message: `mail "${subject}…" to ${address}`,
      timeout: 15_000,
    })
    .toBeGreaterThan(0);
  return found.at(-1)!;
}

/** The link a person would click: the first http(s) address in the plain-text part. */
export function linkIn(mail: ReceivedMail): string {
  const match = /https?:\/\/\S+/.exec(mail.text);
  if (!match) throw new Error(`no link in the mail "${mail.subject}"`);
  return match[0];
}

export async function mailCount(address: string): Promise<number> {
  return (await mailTo(address)).length;
}
