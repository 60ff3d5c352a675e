import { expect, test } from "@playwright/test";
import { ONE_MOVE_PATHS_REQUEST } from "../fixtures/paths-request";
import { query } from "./db";

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
  expect(keys.map((k) => k.key).sort()).toEqual(["pathsIpHour:127.0.0.1", "pathsIpMinute:127.0.0.1"]);
});
