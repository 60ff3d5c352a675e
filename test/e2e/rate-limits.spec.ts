import { createHash, randomUUID } from "node:crypto";
import { expect, test } from "@playwright/test";
import { ONE_MOVE_PATHS_REQUEST } from "../fixtures/paths-request";
import { query } from "./db";
import { personWithPassword, postAuthAction, signInOverHttp, withSecondServer } from "./http";
import { mailCount, waitForMail } from "./mail";

// Real HTTP against the production server (scripts/serve.mjs), which runs with no trusted proxy
// (TRUSTED_PROXY_HOPS unset): every request here comes from 127.0.0.1, whatever it claims.

test.beforeEach(async () => {
  await query("delete from rate_limits");
});

// LIMITS.pathsIpMinute in src/server/auth/rate-limit.ts.
const PATHS_PER_MINUTE = 30;
/** tooManyMessage in src/server/auth/rate-limit.ts. */
const TOO_MANY = /Too many attempts, try again in \d+ minutes?\./;

test("rotating X-Forwarded-For does not reset a per-address budget when no proxy is trusted", async ({ request }) => {
  for (let i = 1; i <= PATHS_PER_MINUTE; i++) {
    const res = await request.post("/api/paths", {
      data: ONE_MOVE_PATHS_REQUEST,
      headers: { "x-forwarded-for": `203.0.113.${i}` },
    });
    expect(res.status(), `request ${i}`).toBe(200);
  }
  const refused = await request.post("/api/paths", {
    data: ONE_MOVE_PATHS_REQUEST,
    headers: { "x-forwarded-for": "198.51.100.77, 203.0.113.250" },
  });
  expect(refused.status()).toBe(429);
  expect(await refused.json()).toEqual({
    error: { code: "rate_limited", message: "Too many attempts, try again in 1 minute." },
  });
  expect(Number(refused.headers()["retry-after"])).toBeGreaterThan(0);

  // The one budget spent is the connection's own address; none of the claimed ones got a key.
  const keys = await query<{ key: string }>("select `key` from rate_limits where `key` like 'pathsIp%'");
  const loopback = createHash("sha256").update("127.0.0.1").digest("base64url");
  expect(keys.map((k) => k.key).sort()).toEqual([`pathsIpHour:${loopback}`, `pathsIpMinute:${loopback}`]);
});

test("sign-in link requests with a CSRF token next-auth refuses spend nothing; the real one gets its link", async ({
  request,
}) => {
  const email = `csrf-${Date.now()}@example.test`;
  // The browser's first step: next-auth sets its CSRF cookie and answers the token.
  const { csrfToken } = (await (await request.get("/api/auth/csrf")).json()) as { csrfToken: string };
  const ask = (token: string) =>
    request.post("/api/auth/signin/email", { form: { email, csrfToken: token, callbackUrl: "/", json: "true" } });

  for (let i = 0; i < 10; i++) {
    const refused = await ask(i % 2 ? `${csrfToken}${i}` : csrfToken.replace(/^./, (c) => (c === "a" ? "b" : "a")));
    // next-auth's own refusal: back to the sign-in page, nothing sent.
    expect(refused.status()).toBe(200);
    expect(((await refused.json()) as { url: string }).url).toContain("csrf=true");
  }
  expect(await query("select `key` from rate_limits where `key` like 'signInLink%' or `key` like 'mailIp%'")).toEqual(
    [],
  );
  expect(await mailCount(email)).toBe(0);

  const sent = await ask(csrfToken);
  expect(sent.status()).toBe(200);
  expect(((await sent.json()) as { url: string }).url).not.toContain("error=");
  expect((await waitForMail(email)).subject).toBe("Your Framefork sign-in link");
});

/**
 * Every limited route and form, pushed one try past its limit in a fresh server, answers "too
 * many attempts" with its wait: a 429 from a route, the rate_limited state from a form, the
 * sign-in page's message from next-auth. The limiters are kept on `globalThis` and Next builds
 * route handlers and server actions into separate bundles, so in the fresh server the limits
 * both sides share are first made by the other side on purpose: the mail limit per address by
 * a form (then spent by the sign-in link route), the password limits by the sign-in route (then
 * spent by the change-password form). Recognising a limit by its class broke exactly there:
 * "something went wrong" or a 500 instead of the wait.
 */
test("each limited route and form answers its wait one try past the limit, also where the other bundle made the limiter", async () => {
  test.setTimeout(240_000);
  const owner = await personWithPassword("limits");
  const team = await teamOwnedBy(owner.id);

  await withSecondServer(
    (base) => ({ NEXTAUTH_URL: base }),
    async (base) => {
      const origin = { origin: new URL(base).origin };
      const { csrf, session } = await signInOverHttp(base, owner);
      const cookie = [...csrf, ...session].map((c) => `${c.name}=${c.value}`).join("; ");
      const csrfToken = decodeURIComponent(csrf.find((c) => c.name === "next-auth.csrf-token")!.value).split("|")[0]!;
      const address = (what: string, i: number) => `${what}-${i}-${randomUUID().slice(0, 6)}@example.test`;

      const askForLink = async (email: string) => {
        const res = await fetch(`${base}/api/auth/signin/email`, {
          method: "POST",
          headers: { "content-type": "application/x-www-form-urlencoded", cookie },
          body: new URLSearchParams({ email, csrfToken, callbackUrl: "/", json: "true" }),
        });
        const text = await res.text();
        expect(res.status, text.slice(0, 300)).toBeLessThan(500);
        return { status: res.status, error: errorIn((JSON.parse(text) as { url: string }).url) };
      };
      const wrongPassword = async () => {
        const res = await fetch(`${base}/api/auth/callback/credentials`, {
          method: "POST",
          headers: { "content-type": "application/x-www-form-urlencoded", cookie },
          body: new URLSearchParams({ csrfToken, email: owner.email, password: "not the password", json: "true" }),
        });
        return errorIn(((await res.json()) as { url: string }).url);
      };
      const form = (page: string, name: string, fields: Record<string, string>) =>
        postAuthAction(base, page, name, fields, cookie);
      /** A form's answer: refused by a limit (with the wait), or anything else that is not our fault. */
      const limited = (answer: { status: number; text: string }) => {
        expect(answer.status, answer.text.slice(0, 300)).toBeLessThan(500);
        expect(answer.text).not.toContain('"code":"internal"');
        return answer.text.includes('"code":"rate_limited"');
      };

      // The shared limiters, each made first by the side that will not be pushed over it.
      expect(limited(await form("/forgot-password", "requestPasswordReset", { email: address("first", 0) }))).toBe(
        false,
      ); // a form makes mailIp
      expect(await wrongPassword()).toContain("don't match"); // the sign-in route makes the password limits

      // The sign-in link route, over the mail limit per address a form made (LIMITS.mailIp: 20).
      await query("delete from rate_limits");
      for (let i = 1; i <= 20; i++) expect((await askForLink(address("link", i))).status, `link ${i}`).toBe(200);
      const linkRefused = await askForLink(address("link", 21));
      expect(linkRefused.status).toBe(429);
      expect(linkRefused.error).toMatch(TOO_MANY);

      // The change-password form, over the password limit the sign-in route made (passwordAccountIp: 10).
      await query("delete from rate_limits");
      const change = { currentPassword: "not the password", newPassword: "another long password" };
      for (let i = 1; i <= 10; i++)
        expect(limited(await form("/account", "changePassword", change)), `try ${i}`).toBe(false);
      const changeRefused = await form("/account", "changePassword", change);
      expect(limited(changeRefused)).toBe(true);
      expect(changeRefused.text).toMatch(TOO_MANY);

      // Password sign-in, over the same limit (passwordAccountIp: 10), even with the right password from here.
      await query("delete from rate_limits");
      for (let i = 1; i <= 10; i++) expect(await wrongPassword(), `try ${i}`).toContain("don't match");
      expect(await wrongPassword()).toMatch(TOO_MANY);

      // Each form that mails a stranger's address, over its own budget (3 per address and e-mail).
      for (const [page, name, fields] of [
        ["/forgot-password", "requestPasswordReset", { email: address("reset", 0) }],
        ["/sign-in", "resendConfirmation", { email: address("resend", 0), callbackUrl: "/" }],
      ] as const) {
        await query("delete from rate_limits");
        for (let i = 1; i <= 3; i++) expect(limited(await form(page, name, fields)), `${name} ${i}`).toBe(false);
        const refused = await form(page, name, fields);
        expect(limited(refused), name).toBe(true);
        expect(refused.text).toMatch(TOO_MANY);
      }

      // Sign-up, over its limit per address (signUpIp: 10).
      await query("delete from rate_limits");
      const signUp = (i: number) =>
        form("/sign-up", "signUp", {
          name: `Limit ${i}`,
          email: address("signup", i),
          password: "long enough password",
        });
      for (let i = 1; i <= 10; i++) expect(limited(await signUp(i)), `sign-up ${i}`).toBe(false);
      const signUpRefused = await signUp(11);
      expect(limited(signUpRefused)).toBe(true);
      expect(signUpRefused.text).toMatch(TOO_MANY);

      // The routes: paths per address (30 a minute) and invites per sender (20 an hour).
      const routeOverLimit = async (path: string, body: (i: number) => unknown, allowed: number, ok: number) => {
        await query("delete from rate_limits");
        const post = (i: number) =>
          fetch(`${base}${path}`, {
            method: "POST",
            headers: { "content-type": "application/json", cookie, ...origin },
            body: JSON.stringify(body(i)),
          });
        for (let i = 1; i <= allowed; i++) expect((await post(i)).status, `${path} ${i}`).toBe(ok);
        const refused = await post(allowed + 1);
        expect(refused.status, path).toBe(429);
        expect(await refused.json()).toEqual({
          error: { code: "rate_limited", message: expect.stringMatching(TOO_MANY) },
        });
      };
      await routeOverLimit("/api/paths", () => ONE_MOVE_PATHS_REQUEST, PATHS_PER_MINUTE, 200);
      await routeOverLimit(
        `/api/teams/${team}/invites`,
        (i) => ({ email: address("invitee", i), role: "viewer" }),
        20,
        201,
      );
    },
  );
  await query("delete from rate_limits");
});

/** The message next-auth sends to the sign-in page with a refusal (its `?error=`). */
const errorIn = (url: string) => new URL(url).searchParams.get("error") ?? "";

/** A team owned by `userId`, straight into the database; its slug. */
async function teamOwnedBy(userId: string): Promise<string> {
  const slug = `limits-${randomUUID().slice(0, 8)}`;
  await query("insert into teams (slug, name) values (?, ?)", [slug, `Limits ${slug.slice(7)}`]);
  const [team] = await query<{ id: number }>("select id from teams where slug = ?", [slug]);
  await query("insert into memberships (team_id, user_id, role) values (?, ?, 'owner')", [team!.id, userId]);
  return slug;
}
