// Serves the production build (`next build` first), like `next start -p PORT -H HOST`, with two
// differences:
// - X-Forwarded-For always ends with the address of whoever opened the connection, appended the
//   way a proxy appends it. `next start` writes that address only when the header is absent, so a
//   client that sends its own X-Forwarded-For hides where it comes from. The per-address rate
//   limits read this list (clientIp in src/server/auth/rate-limit.ts, with TRUSTED_PROXY_HOPS
//   saying how many proxies in front of this server to believe).
// - A shared cache in front of Next (shared-cache.mjs) keeps what the app addresses to shared
//   caches, such as the pages of a published Edition, and sends it again without Next.
import { createServer } from "node:http";
import { parseArgs } from "node:util";
import { createSharedCache } from "./shared-cache.mjs";

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
const sharedCache = createSharedCache();

createServer((req, res) => {
  const socketAddress = req.socket.remoteAddress ?? "unknown";
  const forwarded = req.headers["x-forwarded-for"];
  req.headers["x-forwarded-for"] = forwarded ? `${forwarded}, ${socketAddress}` : socketAddress;
  sharedCache(req, res, () => handle(req, res)).catch((error) => {
    console.error("[serve] unexpected error:", error);
    if (!res.headersSent) res.statusCode = 500;
    res.end();
  });
}).listen(port, hostname, () => {
  console.log(`[serve] ready on http://${hostname ?? "localhost"}:${port}`);
});
