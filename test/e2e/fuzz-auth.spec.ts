import fc from "fast-check";
import { expect, test } from "@playwright/test";
import { query } from "./db";

// next-auth's own endpoints, fuzzed over HTTP: they read cookies() from Next's request scope, which
// only a running server has, so the route fuzzing of test/unit/authz/fuzz.test.ts sends them here.
// Arbitrary paths under /api/auth, queries and forms, with and without a real CSRF token: no answer
// is a 500, and nothing is written unless the answer is "a sign-in link was sent".
// Fixed seed for CI; FUZZ_SEED=<n> and FUZZ_RUNS=<n> explore further; a failure prints its seed.

const SEED = Number(process.env.FUZZ_SEED ?? 1_207_2026);
const RUNS = Number(process.env.FUZZ_RUNS ?? 60);

const SEGMENTS = [
  "signin",
  "callback",
  "session",
  "csrf",
  "providers",
  "signout",
  "error",
  "verify-request",
  "_log",
  "credentials",
  "email",
];
const NASTY = [
  "",
  "..",
  "%",
  "%E0%A4%A",
  "\u0000",
  "\ud800",
  "a".repeat(300),
  "x'); DROP TABLE users; --",
  "//evil.test",
];
const text = fc.oneof(
  fc.string({ maxLength: 20 }),
  fc.string({ unit: "binary", maxLength: 20 }),
  fc.constantFrom(...NASTY),
);
/** Text as it can travel in an address or a form: a lone surrogate becomes U+FFFD, as a browser would send it. */
const sendable = (s: string) => s.toWellFormed();
const field = fc.oneof(
  fc.constantFrom("email", "password", "csrfToken", "callbackUrl", "json", "token", "error"),
  text,
);
const value = fc.oneof(text, fc.emailAddress(), fc.constantFrom("true", "/", "http://evil.test/", "/teams"));

/** Every table's checksum but the rate limits' counters. */
async function checksums(): Promise<Record<string, unknown>> {
  const tables = (await query<Record<string, string>>("show tables")).map((r) => Object.values(r)[0]!);
  const names = tables.filter((t) => t !== "rate_limits");
  const rows = await query<{ Table: string; Checksum: unknown }>(
    `checksum table ${names.map((n) => `\`${n}\``).join(", ")}`,
  );
  return Object.fromEntries(rows.map((r) => [r.Table, r.Checksum]));
}

const inputArb = fc.record({
  method: fc.constantFrom("GET", "POST"),
  segments: fc.array(fc.oneof(fc.constantFrom(...SEGMENTS), text), { minLength: 1, maxLength: 3 }),
  query: fc.array(fc.tuple(field, value), { maxLength: 3 }),
  form: fc.array(fc.tuple(field, value), { maxLength: 4 }),
  /** A JSON body instead of a form: well-formed, or cut short. */
  json: fc.constantFrom(null, "whole", "cut"),
  withCsrf: fc.boolean(),
  /** A forged return-address cookie (next-auth sets it itself; a stranger may send any). */
  callbackCookie: fc.option(value, { freq: 4 }),
});
type Input = typeof inputArb extends fc.Arbitrary<infer T> ? T : never;
const input = (over: Partial<Input>): [Input] => [
  {
    method: "POST",
    segments: ["signin"],
    query: [],
    form: [],
    json: null,
    withCsrf: false,
    callbackCookie: null,
    ...over,
  },
];
/** Answers once found to be 500s, kept whatever the seed (fixed in src/server/auth/next-auth-input.ts). */
const EXAMPLES = [
  input({
    segments: ["signin", "email"],
    form: [
      ["callbackUrl", "x"],
      ["email", "a@example.test"],
    ],
    withCsrf: true,
  }),
  input({ segments: ["session"], query: [["callbackUrl", "true"]] }),
  input({ segments: ["callback", "credentials"], form: [["callbackUrl", "true"]], withCsrf: true }),
  input({ segments: ["signin"], form: [["callbackUrl", "/"]], json: "cut" }),
  input({ method: "GET", segments: ["callback", "credentials"] }),
  input({ method: "GET", segments: ["session"], callbackCookie: "true" }),
  input({ method: "GET", segments: ["error", "\u{6f90d}"] }),
  input({ method: "GET", segments: ["error"], query: [["error", "\n"]] }),
];

test("next-auth's endpoints: arbitrary paths, queries and forms get no 500, and a refusal writes nothing", async ({
  request,
}, testInfo) => {
  test.skip(testInfo.project.name !== "desktop", "plain HTTP: one browser project is enough");
  testInfo.setTimeout(180_000);
  await query("delete from rate_limits");
  const { csrfToken } = (await (await request.get("/api/auth/csrf")).json()) as { csrfToken: string };
  const jar = (await request.storageState()).cookies.map((c) => `${c.name}=${c.value}`);
  const answers: number[] = [];

  await fc.assert(
    fc.asyncProperty(inputArb, async ({ method, segments, query: q, form, json, withCsrf, callbackCookie }) => {
      const search = new URLSearchParams(q.map(([k, v]) => [sendable(k), sendable(v)]));
      const path = `/api/auth/${segments.map((s) => encodeURIComponent(sendable(s))).join("/")}?${search}`;
      const body = Object.fromEntries(form.map(([k, v]) => [sendable(k), sendable(v)]));
      if (withCsrf) body.csrfToken = csrfToken;
      const cookie = [
        ...jar,
        ...(callbackCookie === null ? [] : [`next-auth.callback-url=${encodeURIComponent(sendable(callbackCookie))}`]),
      ];
      const sent =
        method === "GET"
          ? {}
          : json
            ? {
                headers: { "content-type": "application/json" },
                data: json === "cut" ? JSON.stringify(body).slice(0, -1) : JSON.stringify(body),
              }
            : { form: body };

      const before = await checksums();
      const res = await request.fetch(path, {
        method,
        maxRedirects: 0,
        ...sent,
        headers: { ...("headers" in sent ? sent.headers : {}), cookie: cookie.join("; ") },
      });
      answers.push(res.status());
      expect(res.status(), `${method} ${path}`).toBeLessThan(500);
      // The one write a stranger may cause: a sign-in link (a verification token) mailed to an address.
      const linkSent = /\/check-email|verify-request/.test(res.headers().location ?? (await res.text()));
      if (!linkSent) expect(await checksums(), `${method} ${path} wrote nothing`).toEqual(before);
    }),
    { seed: SEED, numRuns: RUNS, endOnFailure: true, examples: EXAMPLES },
  );
  expect(
    answers.some((s) => s >= 300),
    "some calls were refused or redirected",
  ).toBe(true);
});

test("a forged return-address cookie is dropped and deleted, on every kind of page and route, not a 500", async ({
  request,
}, testInfo) => {
  test.skip(testInfo.project.name !== "desktop", "plain HTTP: one browser project is enough");
  for (const path of ["/", "/teams", "/games/vesper-circuit", "/api/teams", "/api/auth/session", "/api/health"]) {
    const res = await request.get(path, { maxRedirects: 0, headers: { cookie: "next-auth.callback-url=true" } });
    expect(res.status(), path).toBeLessThan(500);
    const deleted = res
      .headersArray()
      .filter((h) => h.name.toLowerCase() === "set-cookie" && h.value.startsWith("next-auth.callback-url=;"));
    expect(deleted, `${path} deletes the cookie`).toHaveLength(1);
  }
});
