import { randomBytes, randomUUID } from "node:crypto";
import { NextRequest } from "next/server";
import { afterAll, beforeEach, describe, expect, test, vi } from "vitest";
import { requestPasswordReset } from "@/app/(auth)/actions";
import { POST } from "@/app/api/auth/[...nextauth]/route";
import { env } from "@/env";
import { LIMITS } from "@/server/auth/rate-limit";
import { closeDb } from "@/server/db";
// Reference: next-auth's own CSRF token maker, the one its handler checks against.
import { createCSRFToken } from "../../../node_modules/next-auth/core/lib/csrf-token.js";

// The mail limits through the real sign-in link route and the real password reset action, against
// the test MariaDB. next-auth itself needs a live Next request scope; here it stands as a stub
// that only says it was reached, so the test sees what the route does before handing over.
const reachedNextAuth = vi.fn<() => void>();
vi.mock("next-auth", () => ({
  default: () => async () => {
    reachedNextAuth();
    return Response.json({ url: "http://127.0.0.1/api/auth/verify-request" });
  },
}));

// The reset action reads the caller's address from next/headers; no mail leaves.
let actionAddress = "";
vi.mock("next/headers", () => ({ headers: async () => new Headers({ "x-forwarded-for": actionAddress }) }));
vi.mock("@/server/mail", async (original) => ({
  ...(await original<typeof import("@/server/mail")>()),
  sendMail: async () => {},
}));

beforeEach(() => reachedNextAuth.mockClear());
afterAll(closeDb);

/** A CSRF cookie and its token as next-auth makes them for a browser's first GET /api/auth/csrf. */
function csrfPair(secret = env().NEXTAUTH_SECRET): { cookie: string; token: string } {
  const made = createCSRFToken({ options: { secret } as never, isPost: false });
  return { cookie: made.cookie!, token: made.csrfToken };
}

const newAddress = () =>
  `2001:db8:${randomBytes(4)
    .toString("hex")
    .replace(/(....)(....)/, "$1:$2")}::2`;

function askForLink(email: string, ip: string, csrf: { cookie?: string; token?: string }) {
  const form = new URLSearchParams({ email, callbackUrl: "/", json: "true" });
  if (csrf.token !== undefined) form.set("csrfToken", csrf.token);
  return POST(
    new NextRequest("http://127.0.0.1/api/auth/signin/email", {
      method: "POST",
      headers: {
        "content-type": "application/x-www-form-urlencoded",
        "x-forwarded-for": ip,
        ...(csrf.cookie ? { cookie: `next-auth.csrf-token=${encodeURIComponent(csrf.cookie)}` } : {}),
      },
      body: form.toString(),
    }),
    { params: Promise.resolve({ nextauth: ["signin", "email"] }) },
  );
}

/** Asks for a password reset from `ip`: "sent" (the action moved on to "check your e-mail") or its error. */
async function askForReset(email: string, ip: string): Promise<string> {
  actionAddress = ip;
  const form = new FormData();
  form.set("email", email);
  try {
    const state = await requestPasswordReset(null, form);
    return state?.ok === false ? state.error : "no redirect";
  } catch (error) {
    if (String((error as { digest?: string }).digest ?? "").startsWith("NEXT_REDIRECT")) return "sent";
    throw error;
  }
}

const newEmail = () => `mail-${randomUUID()}@example.test`;
const TOO_MANY = /^Too many attempts, try again in \d+ minutes?\.$/;
const TIGHT = LIMITS.signInLinkEmailIp.points;

describe("POST /api/auth/signin/email", () => {
  test("a request next-auth would refuse for its CSRF token spends no points", async () => {
    const email = newEmail();
    const ip = newAddress();
    const good = csrfPair();
    const forged = csrfPair("another-secret-another-secret-another-secret");
    const refusedByNextAuth = [
      {}, // no cookie, no token
      { token: good.token }, // the token without its cookie
      { cookie: good.cookie }, // the cookie without the token
      { cookie: good.cookie, token: csrfPair().token }, // another token
      forged, // a pair signed with another secret
      { cookie: `${good.token}|${"0".repeat(64)}`, token: good.token }, // a made-up hash
    ];
    for (let round = 0; round < 3; round++)
      for (const csrf of refusedByNextAuth) {
        const res = await askForLink(email, ip, csrf);
        expect(res.status).toBe(200); // next-auth's own answer (here its stand-in)
      }
    expect(reachedNextAuth).toHaveBeenCalledTimes(3 * refusedByNextAuth.length);

    // The budget is whole: a real request goes through as often as the limit allows.
    for (let i = 0; i < TIGHT; i++) expect((await askForLink(email, ip, good)).status).toBe(200);
    const refused = await askForLink(email, ip, good);
    expect(refused.status).toBe(429);
    expect(Number(refused.headers.get("retry-after"))).toBeGreaterThan(0);
    const { url } = (await refused.json()) as { url: string };
    expect(new URL(url).searchParams.get("error")).toMatch(/^Too many attempts, try again in \d+ minutes?\.$/);
    expect(reachedNextAuth).toHaveBeenCalledTimes(3 * refusedByNextAuth.length + TIGHT);
  });

  test("a valid token with a bad e-mail is a 400 that spends nothing; a JSON body (next-auth reads forms) is a 415", async () => {
    const ip = newAddress();
    const good = csrfPair();
    const res = await askForLink("not an address", ip, good);
    expect(res.status).toBe(400);
    const unreadable = await POST(
      new NextRequest("http://127.0.0.1/api/auth/signin/email", {
        method: "POST",
        headers: { "content-type": "application/json", "x-forwarded-for": ip },
        body: "{ not json",
      }),
      { params: Promise.resolve({ nextauth: ["signin", "email"] }) },
    );
    expect(unreadable.status).toBe(415);
    expect(reachedNextAuth).not.toHaveBeenCalled();
  });
});

describe("mail limits", () => {
  test("another client's reset requests do not block the owner's reset", async () => {
    const email = newEmail();
    const attacker = newAddress();
    const flood = [];
    for (let i = 0; i < 12; i++) flood.push(await askForReset(email, attacker));
    expect(flood.filter((r) => r === "sent")).toHaveLength(LIMITS.passwordResetEmailIp.points);
    expect(flood.filter((r) => TOO_MANY.test(r))).toHaveLength(12 - LIMITS.passwordResetEmailIp.points);
    expect(await askForReset(email, newAddress())).toBe("sent");
  });

  test("sign-in links and password resets have separate budgets", async () => {
    const email = newEmail();
    const ip = newAddress();
    const good = csrfPair();
    for (let i = 0; i < LIMITS.passwordResetEmailIp.points; i++) expect(await askForReset(email, ip)).toBe("sent");
    expect(await askForReset(email, ip)).toMatch(TOO_MANY);
    // The sign-in link is still there for the same e-mail from the same address, and the other way round.
    for (let i = 0; i < TIGHT; i++) expect((await askForLink(email, ip, good)).status).toBe(200);
    expect((await askForLink(email, ip, good)).status).toBe(429);
  });

  test("one inbox is capped however many addresses ask", async () => {
    const email = newEmail();
    const cap = LIMITS.passwordResetEmail.points;
    const results = [];
    // Each address stays within its own tight budget.
    for (let i = 0; i < cap + 2; i++) results.push(await askForReset(email, newAddress()));
    expect(results.slice(0, cap)).toEqual(Array(cap).fill("sent"));
    expect(results.slice(cap)).toEqual([expect.stringMatching(TOO_MANY), expect.stringMatching(TOO_MANY)]);
  });

  test("one address asking for many inboxes is stopped", async () => {
    const ip = newAddress();
    const results = [];
    for (let i = 0; i < LIMITS.mailIp.points + 1; i++) results.push(await askForReset(newEmail(), ip));
    expect(results.filter((r) => r === "sent")).toHaveLength(LIMITS.mailIp.points);
    expect(results.at(-1)).toMatch(TOO_MANY);
    // Refused there, it spends nothing of an inbox's cap: other addresses still get all of it.
    const inbox = newEmail();
    for (let i = 0; i < 3; i++) expect(await askForReset(inbox, ip)).toMatch(TOO_MANY);
    const others = [];
    for (let i = 0; i < LIMITS.passwordResetEmail.points; i++) others.push(await askForReset(inbox, newAddress()));
    expect(others).toEqual(Array(LIMITS.passwordResetEmail.points).fill("sent"));
  });
});
