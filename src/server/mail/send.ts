import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/env";

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

const cache = globalThis as unknown as { frameforkMailer?: Transporter };

/** One SMTP transport per process, opened on first use (so `next build` never connects). */
function transport(): Transporter {
  cache.frameforkMailer ??= nodemailer.createTransport(env().SMTP_URL);
  return cache.frameforkMailer;
}

/** Sends one multipart (text + HTML) message from MAIL_FROM through SMTP_URL. */
export async function sendMail({ to, subject, text, html }: OutgoingMail): Promise<void> {
  await transport().sendMail({ from: env().MAIL_FROM, to, subject, text, html });
}
