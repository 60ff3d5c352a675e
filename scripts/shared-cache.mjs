// The shared cache in front of Next in scripts/serve.mjs, as a CDN in front of the app would be:
// an answer the app addresses to shared caches (`s-maxage`) is kept for as long as it says and
// sent again without asking Next. Those are the pages of a published Edition of a public game,
// its graph data, the links anyone may open (src/server/published.ts, graph-bodies.ts) and the
// pages Next prerenders at build, which it marks so itself. A page rendered for one reader
// (`private, no-store`), a draft, a team's page, an answer that sets a cookie, is never kept.
// Static files are not either: Next sends them from disk, and browsers keep them a year.
//
// Whether an answer may be kept, for how long and for which later request (Vary) follows
// RFC 9111 for a shared cache, as http-cache-semantics reads it; this file only stores and
// sends. Each answer is kept as it leaves, compressed, so each Accept-Encoding a browser sends
// is a variant of its own (Next's answers Vary on it). Only plain GETs are answered from here:
// a HEAD, a Range, a conditional request or a reload's `no-cache` goes to Next. An answer sent from here
// says so in a Cache-Status header (RFC 9211).
import CachePolicy from "http-cache-semantics";
import { LRUCache } from "lru-cache";

/** Larger answers are sent as they are, not kept. */
export const MAX_KEPT_ANSWER_BYTES = 1024 * 1024;
/** What all kept answers may weigh together; the least recently used go first. */
const MAX_KEPT_BYTES = 64 * 1024 * 1024;
/** How many variants (Vary) of one address are kept; the oldest goes first. */
const MAX_VARIANTS = 8;
/** The cache's name in Cache-Status. */
const NAME = "framefork";

/**
 * A connect-style middleware, `(req, res, next)`: sends a kept answer, or lets `next` answer and
 * keeps what it sends when it may. Put it before anything else touches `res`, so that what is
 * kept is what leaves (after Next's compression).
 */
export function createSharedCache({ maxBytes = MAX_KEPT_BYTES } = {}) {
  /** Kept answers by address (path and query): variants, each with its own policy. */
  const addresses = new LRUCache({
    maxSize: maxBytes,
    sizeCalculation: (variants) => variants.reduce((sum, v) => sum + v.body.length, 0) || 1,
  });
  /** Addresses whose kept answer went stale and is being asked for again: when that is done. */
  const refreshing = new Map();

  function answer(req, res) {
    const found = addresses.get(req.url)?.find((v) => v.policy.satisfiesWithoutRevalidation(req));
    if (!found) return false;
    const headers = found.policy.responseHeaders();
    headers["content-length"] = String(found.body.length);
    headers["cache-status"] = `${NAME}; hit; ttl=${Math.floor(found.policy.timeToLive() / 1000)}`;
    res.writeHead(found.policy.status(), headers);
    res.end(found.body);
    return true;
  }

  function keep(req, res) {
    watchBody(res, (body) => {
      const policy = new CachePolicy(req, { status: res.statusCode, headers: plainHeaders(res) }, { shared: true });
      if (!addressedToSharedCaches(res) || !policy.storable() || policy.timeToLive() <= 0) return;
      // The new answer replaces the variants it would be sent for, and those gone stale.
      const others = (addresses.get(req.url) ?? []).filter(
        (v) => v.policy.timeToLive() > 0 && !v.policy.satisfiesWithoutRevalidation(req),
      );
      addresses.set(req.url, [{ policy, body }, ...others].slice(0, MAX_VARIANTS));
    });
  }

  async function serve(req, res, next) {
    if (!plainGet(req)) return next();
    if (answer(req, res)) return;
    // When a kept answer goes stale, fifty readers at once would all ask the app for it again:
    // one asks, the others wait for its answer (request collapsing). Addresses never kept
    // before (a page rendered for each reader) never wait.
    if (addresses.has(req.url)) {
      const pending = refreshing.get(req.url);
      if (pending) {
        await pending;
        if (answer(req, res)) return;
      } else {
        refreshing.set(
          req.url,
          finished(res).then(() => refreshing.delete(req.url)),
        );
      }
    }
    keep(req, res);
    return next();
  }

  return Object.assign(serve, { size: () => addresses.size });
}

/** Settles once the answer is sent or the connection is gone. */
function finished(res) {
  return new Promise((done) => res.once("close", done));
}

/** A request this cache deals with: a GET with no range, no condition and no reload. */
function plainGet(req) {
  const h = req.headers;
  return req.method === "GET" && !h.range && !h["if-none-match"] && !h["if-modified-since"];
}

/** A 200 with `s-maxage`, without a cookie: what the app means shared caches to keep. */
function addressedToSharedCaches(res) {
  const cacheControl = String(res.getHeader("cache-control") ?? "");
  return res.statusCode === 200 && /\bs-maxage=[1-9]/i.test(cacheControl) && !res.hasHeader("set-cookie");
}

/** The answer's headers as http-cache-semantics reads them: lower-case names, string values. */
function plainHeaders(res) {
  const headers = {};
  for (const [name, value] of Object.entries(res.getHeaders())) {
    headers[name] = Array.isArray(value) ? value.join(", ") : String(value);
  }
  return headers;
}

/**
 * Collects what is written to `res` and hands the whole body to `whole` once the answer is sent,
 * unless it says at its first byte that no shared cache is meant to keep it, or it grows past
 * MAX_KEPT_ANSWER_BYTES.
 */
function watchBody(res, whole) {
  const { write, end } = res;
  let chunks = [];
  let bytes = 0;
  let keeping = null;
  const add = (chunk, encoding) => {
    keeping ??= addressedToSharedCaches(res);
    if (!keeping || chunk == null || typeof chunk === "function") return;
    const buffer =
      typeof chunk === "string"
        ? Buffer.from(chunk, typeof encoding === "string" ? encoding : "utf8")
        : Buffer.from(chunk);
    bytes += buffer.length;
    if (bytes > MAX_KEPT_ANSWER_BYTES) {
      keeping = false;
      chunks = [];
    } else {
      chunks.push(buffer);
    }
  };
  res.write = function (chunk, encoding, callback) {
    add(chunk, encoding);
    return write.call(this, chunk, encoding, callback);
  };
  res.end = function (chunk, encoding, callback) {
    add(chunk, encoding);
    res.write = write;
    res.end = end;
    const result = end.call(this, chunk, encoding, callback);
    if (keeping && !res.destroyed) whole(Buffer.concat(chunks));
    return result;
  };
}
