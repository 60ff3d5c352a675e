import { createServer, request, type IncomingHttpHeaders, type Server, type ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import { gunzipSync, gzipSync } from "node:zlib";
import { afterAll, beforeAll, beforeEach, describe, expect, test } from "vitest";
import { createSharedCache, MAX_KEPT_ANSWER_BYTES, type SharedCache } from "../../../scripts/shared-cache.mjs";

// scripts/shared-cache.mjs, as serve.mjs puts it in front of Next, here in front of a handler
// that answers as each test says and counts how often it is asked. What a shared cache may keep
// and for whom is RFC 9111's (sections named beside the checks); the app's own rule on top is
// that only answers addressed to shared caches (s-maxage) are kept.

const PAGE = `<!doctype html><title>A published page</title>${"<p>row</p>".repeat(100)}`;

interface Answer {
  status: number;
  headers: Record<string, string | string[]>;
  /** Sent in pieces with write() and then end(). */
  pieces: (string | Buffer)[];
  /** How long the app takes to answer. */
  delayMs?: number;
}

let answer: Answer;
let asked = 0;
/** How many requests the app was answering at once, at most. */
let busy = 0;
let mostBusy = 0;
let cache: SharedCache;
let server: Server;
let base: string;

function send(res: ServerResponse) {
  res.statusCode = answer.status;
  for (const [name, value] of Object.entries(answer.headers)) res.setHeader(name, value);
  const pieces = [...answer.pieces];
  const last = pieces.pop();
  for (const piece of pieces) res.write(piece);
  res.end(last);
}

beforeAll(async () => {
  server = createServer((req, res) => {
    void cache(req, res, () => {
      asked += 1;
      busy += 1;
      mostBusy = Math.max(mostBusy, busy);
      const done = () => {
        busy -= 1;
        send(res);
      };
      if (answer.delayMs) setTimeout(done, answer.delayMs);
      else done();
    });
  });
  await new Promise<void>((done) => server.listen(0, "127.0.0.1", done));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(() => new Promise<void>((done) => server.close(() => done())));
beforeEach(() => {
  cache = createSharedCache();
  asked = 0;
  mostBusy = 0;
  answer = {
    status: 200,
    headers: { "content-type": "text/html; charset=utf-8", "cache-control": "public, s-maxage=60" },
    pieces: [PAGE],
  };
});

function get(
  path = "/page",
  headers: Record<string, string> = {},
  method = "GET",
): Promise<{ status: number; headers: IncomingHttpHeaders; body: Buffer }> {
  return new Promise((resolve, reject) => {
    request(`${base}${path}`, { method, headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on("data", (c: Buffer) => chunks.push(c));
      res.on("end", () => resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }));
    })
      .on("error", reject)
      .end();
  });
}

describe("an answer addressed to shared caches (s-maxage)", () => {
  test("is sent again from the cache, the same body, with Age and a Cache-Status hit (RFC 9211)", async () => {
    const first = await get();
    const second = await get();
    expect(asked).toBe(1);
    expect(first.headers["cache-status"]).toBeUndefined();
    expect(second.headers["cache-status"]).toMatch(/^framefork; hit; ttl=(59|60)$/);
    expect(second.status).toBe(200);
    expect(second.body.toString()).toBe(PAGE);
    expect(second.headers["content-length"]).toBe(String(Buffer.byteLength(PAGE)));
    expect(second.headers["content-type"]).toBe("text/html; charset=utf-8");
    // RFC 9111 §5.1: a cache sends Age with what it sends from storage.
    expect(Number(second.headers.age)).toBeGreaterThanOrEqual(0);
  });

  test("is kept whole when it is sent in pieces, and per address with its query", async () => {
    answer.pieces = [PAGE.slice(0, 100), Buffer.from(PAGE.slice(100, 300)), PAGE.slice(300)];
    await get("/page?edition=1-1");
    expect((await get("/page?edition=1-1")).body.toString()).toBe(PAGE);
    expect(asked).toBe(1);
    await get("/page?edition=1-0");
    expect(asked).toBe(2);
  });

  test("is kept as it left, compressed, one variant per Accept-Encoding it Varies on (RFC 9111 §4.1)", async () => {
    answer.headers = { ...answer.headers, vary: "Accept-Encoding", "content-encoding": "gzip" };
    answer.pieces = [gzipSync("gzip for the first")];
    await get("/page", { "accept-encoding": "gzip" });
    answer.headers = { ...answer.headers, "content-encoding": "identity" };
    answer.pieces = ["as it is, for the second"];
    await get("/page", { "accept-encoding": "identity" });
    expect(asked).toBe(2);
    const gzip = await get("/page", { "accept-encoding": "gzip" });
    expect(gunzipSync(gzip.body).toString()).toBe("gzip for the first");
    expect((await get("/page", { "accept-encoding": "identity" })).body.toString()).toBe("as it is, for the second");
    expect(asked).toBe(2);
  });

  test("is asked for again once its s-maxage has passed (RFC 9111 §4.2)", async () => {
    answer.headers["cache-control"] = "public, s-maxage=1";
    await get();
    await get();
    expect(asked).toBe(1);
    await new Promise((done) => setTimeout(done, 1_100));
    answer.pieces = ["the next one"];
    expect((await get()).body.toString()).toBe("the next one");
    expect(asked).toBe(2);
  });

  test("once stale, is asked for again by one request while the others at the same address wait for its answer", async () => {
    answer.headers["cache-control"] = "public, s-maxage=1";
    await get();
    await new Promise((done) => setTimeout(done, 1_100));
    answer.pieces = ["the next one"];
    answer.delayMs = 100;
    const all = await Promise.all(Array.from({ length: 10 }, () => get()));
    expect(asked).toBe(2);
    expect(all.map((a) => a.body.toString())).toEqual(Array(10).fill("the next one"));
  });

  test("goes to the app for a reload, a conditional request, a Range and a HEAD", async () => {
    await get();
    const conditions: Record<string, string>[] = [
      { "cache-control": "no-cache" },
      { "if-none-match": '"abc"' },
      { "if-modified-since": new Date().toUTCString() },
      { range: "bytes=0-10" },
    ];
    for (const headers of conditions) {
      const before = asked;
      await get("/page", headers);
      expect(asked, JSON.stringify(headers)).toBe(before + 1);
    }
    const before = asked;
    await get("/page", {}, "HEAD");
    expect(asked).toBe(before + 1);
  });
});

describe("answers never kept", () => {
  test.each<[string, Partial<Answer>]>([
    [
      "a page rendered for one reader",
      { headers: { "cache-control": "private, no-cache, no-store, max-age=0, must-revalidate" } },
    ],
    ["an answer no one may store (RFC 9111 §5.2.2.5)", { headers: { "cache-control": "no-store, s-maxage=60" } }],
    ["a private answer (RFC 9111 §5.2.2.7)", { headers: { "cache-control": "private, s-maxage=60" } }],
    [
      "a static file, which browsers keep instead",
      { headers: { "cache-control": "public, max-age=31536000, immutable" } },
    ],
    ["an answer with no Cache-Control", { headers: {} }],
    ["an answer that sets a cookie", { headers: { "cache-control": "public, s-maxage=60", "set-cookie": ["a=b"] } }],
    ["a 404", { status: 404 }],
    ["a redirect", { status: 307, headers: { "cache-control": "public, s-maxage=60", location: "/elsewhere" } }],
    ["an answer larger than what is kept", { pieces: ["x".repeat(MAX_KEPT_ANSWER_BYTES), "x"] }],
  ])("%s", async (_, differs) => {
    answer = { ...answer, ...differs };
    await get();
    await get();
    expect(asked).toBe(2);
    expect(cache.size()).toBe(0);
  });

  test("requests for a page rendered for each reader do not wait for one another", async () => {
    answer.headers["cache-control"] = "private, no-store";
    answer.delayMs = 100;
    await Promise.all(Array.from({ length: 5 }, () => get()));
    expect(asked).toBe(5);
    expect(mostBusy).toBe(5);
  });

  test("the answer to a POST", async () => {
    await get("/page", {}, "POST");
    await get("/page", {}, "POST");
    expect(asked).toBe(2);
    expect(cache.size()).toBe(0);
  });
});
