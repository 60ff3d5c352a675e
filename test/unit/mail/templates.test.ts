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
      inviteMail({ teamName: "Night Owls", inviterName: "Ada", role: "coach", url, expiresInDays: 7 }),
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
});
