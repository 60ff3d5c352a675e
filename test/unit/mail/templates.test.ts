import { describe, expect, test } from "vitest";
import {
  accountExistsMail,
  confirmAddressMail,
  escapeHtml,
  inviteMail,
  passwordResetMail,
  signInLinkMail,
} from "@/server/mail/templates";

const hostile = `<script>alert("x")</script>&'`;

describe("mail templates", () => {
  test("escapeHtml replaces the five characters HTML gives meaning to (OWASP XSS prevention rule 1)", () => {
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe("&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;");
  });

  test("every template has a subject, a plain-text part and an HTML part carrying the link", () => {
    const url = "http://127.0.0.1:3000/reset-password?token=abc&x=1";
    for (const mail of [
      signInLinkMail({ url }),
      passwordResetMail({ url, expiresInMinutes: 30 }),
      inviteMail({ teamName: "Night Owls", inviterName: "Coach Lornavex", role: "coach", url, expiresInDays: 7 }),
      confirmAddressMail({ url, expiresInHours: 24 }),
      accountExistsMail({ url }),
    ]) {
      expect(mail.subject.length).toBeGreaterThan(5);
      expect(mail.text).toContain(url);
      expect(mail.html).toMatch(/^<!doctype html>/);
      expect(mail.html).toContain('href="http://127.0.0.1:3000/reset-password?token=abc&amp;x=1"');
      expect(mail.text).not.toMatch(/<[a-z]/i);
    }
    expect(passwordResetMail({ url, expiresInMinutes: 30 }).text).toContain("30 minutes");
    expect(confirmAddressMail({ url, expiresInHours: 24 }).text).toContain("24 hours");
    expect(inviteMail({ teamName: "T", inviterName: "I", role: "player", url, expiresInDays: 1 }).text).toContain(
      "1 day.",
    );
  });

  test("values typed by users cannot add markup to the HTML part", () => {
    const mail = inviteMail({
      teamName: hostile,
      inviterName: hostile,
      role: hostile,
      url: `http://x.example.test/"><script>`,
      expiresInDays: 7,
    });
    expect(mail.html).not.toContain("<script>");
    expect(mail.html).toContain("&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;&amp;&#39;");
    expect(mail.html).not.toMatch(/href="[^"]*"></);
    // The plain-text part shows them as typed.
    expect(mail.text).toContain(hostile);
  });

  test("names lose line breaks and text-direction characters before they reach the subject or a sentence", () => {
    // Rows written before names were checked may hold these; the mail must not carry them.
    const mail = inviteMail({
      teamName: "Night\u202EpuorG\u202C Crew",
      inviterName: "Quellborn\r\nBcc: someone@example.test\u200B",
      role: "player",
      url: "http://127.0.0.1:3000/invites/abc",
      expiresInDays: 7,
    });
    // Line feeds are the templates' own, between paragraphs; nothing else of these categories is left.
    for (const part of [mail.subject, mail.text, mail.html])
      expect(part.replaceAll("\n", "")).not.toMatch(/[\p{Cc}\p{Cf}\u2028\u2029]/u);
    expect(mail.subject).toBe("Quellborn Bcc: someone@example.test invited you to NightpuorG Crew on Framefork");
    expect(mail.text).toContain("Quellborn Bcc: someone@example.test invited you to join the team NightpuorG Crew");
    // Emoji sequences and letters of other scripts stay as they are.
    const kept = inviteMail({
      teamName: "👩‍💻 می‌خواهم",
      inviterName: "Zoë",
      role: "viewer",
      url: "http://x.example.test/",
      expiresInDays: 7,
    });
    expect(kept.subject).toBe("Zoë invited you to 👩‍💻 می‌خواهم on Framefork");
  });
});
