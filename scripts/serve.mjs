// Serves the production build (`next build` first), like `next start -p PORT -H HOST`, with two
// differences: answers are compressed at a faster setting (below), and X-Forwarded-For always
// ends with the address of whoever opened the connection, appended the way a proxy appends it. `next start` writes that address only when the header is
// absent, so a client that sends its own X-Forwarded-For hides where it comes from. The
// per-address rate limits read this list (clientIp in src/server/auth/rate-limit.ts, with
// TRUSTED_PROXY_HOPS saying how many proxies in front of this server to believe).
import { createServer } from "node:http";
import { Duplex } from "node:stream";
import { parseArgs } from "node:util";
import { constants } from "node:zlib";
import compression from "compression";

const { values } = parseArgs({
  options: { port: { type: "string", short: "p" }, hostname: { type: "string", short: "H" } },
});
const port = Number(values.port ?? process.env.PORT ?? 3000);
const hostname = values.hostname;

// As `next start` does, before Next is loaded.
process.env.NODE_ENV ||= "production";
const { default: next } = await import("next");
// No hostname here: Next then takes the proxy's rewrites (to same-origin addresses it builds as
// http://localhost:PORT) as its own. Given the listening host, it would see another origin in
// each rewrite and fetch it over HTTP from itself, doubling the work of every cached page.
const app = next({ dev: false, port });
await app.prepare();
const handle = app.getRequestHandler();

// Answers are compressed here, not by Next (next.config.ts: compress: false), with the same
// middleware Next uses but at a fast setting: every answer is compressed anew, and at Next's
// default (gzip level 6) that took a quarter of the CPU a cached move list costs. gzip level 3
// and brotli quality 1 compress its 67 KB of HTML four times faster into 10.5 KB instead of 9.3.
const compress = compression({ level: 3, brotli: { params: { [constants.BROTLI_PARAM_QUALITY]: 1 } } });

createServer((req, res) => {
  const socketAddress = req.socket.remoteAddress ?? "unknown";
  const forwarded = req.headers["x-forwarded-for"];
  req.headers["x-forwarded-for"] = forwarded ? `${forwarded}, ${socketAddress}` : socketAddress;
  compress(req, res, () =>
    handle(req, res).catch((error) => {
      console.error("[serve] unexpected error:", error);
      if (!res.headersSent) res.statusCode = 500;
      res.end();
    }),
  );
  res.once("close", () => releaseCompression(res));
}).listen(port, hostname, () => {
  console.log(`[serve] ready on http://${hostname ?? "localhost"}:${port}`);
});

/**
 * When a client leaves mid-answer, the compression middleware never ends its zlib stream, which
 * then outlives the answer (Next's own server releases it the same way): its `res.on("drain")`
 * hands back that stream.
 */
function releaseCompression(res) {
  if (res.writableFinished) return;
  const noop = () => {};
  const stream = res.on("drain", noop);
  if (stream === res || !(stream instanceof Duplex)) {
    res.off("drain", noop);
    return;
  }
  stream.destroy();
}
