import { createHash } from "node:crypto";
import { expect, test } from "@playwright/test";
import { ONE_MOVE_PATHS_REQUEST } from "../fixtures/paths-request";
import { query } from "./db";
import { mailCount, waitForMail } from "./mail";

// Real HTTP against the production server (scripts/serve.mjs), which runs with no trusted proxy
// (TRUSTED_PROXY_HOPS unset): every request here comes from 127.0.0.1, whatever it claims.

test.beforeEach(async () => {
  await query("delete from rate_limits");
});

// LIMITS.pathsIpMinute in src/server/auth/rate-limit.ts.
const PATHS_PER_MINUTE = 30;

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
