import { NextResponse, type NextRequest } from "next/server";
import { env } from "@/env";
import { CALLBACK_COOKIE, usableCallbackUrl } from "@/lib/callback-url";
import { AppError } from "@/lib/errors";
import {
  DATABASE_DOWN_MESSAGE,
  databaseAnswers,
  databaseUnavailable,
  RETRY_AFTER_SECONDS,
} from "@/server/db/unavailable";
import { crossSiteRefusal } from "@/server/http";
import { isPublishedAddress, PUBLISHED_PREFIX, publishedAddress } from "@/server/published";

/**
 * Runs before every route (static files aside), for what no route can do
 * itself:
 * - an address with a broken %-escape would fail in Next's own router with a
 *   plain-text 500: API paths get our 400 JSON, pages our not-found page;
 * - a page POST (a server action) from another site gets a 403 here, where
 *   Next's own check would answer 500;
 * - while MariaDB is not answering, pages (and next-auth's routes) get a 503
 *   page that says so, instead of an error page with status 500; a cached
 *   copy (below) is still served;
 * - a forged next-auth return-address cookie is dropped (next-auth answers it with a 500);
 * - a page of a published Edition of a public game is sent to its cached copy
 *   (src/server/published.ts); a cached copy's own address is answered only when it is current;
 * - HSTS, when the app is served over https.
 * API routes check the origin and map database errors themselves, in `handle()`.
 */
export async function proxy(request: NextRequest): Promise<Response> {
  const { pathname } = request.nextUrl;
  const api = pathname.startsWith("/api/");

  if (!decodable(pathname)) {
    if (api) {
      return withHsts(
        json(
          new AppError("bad_request", "The address is not valid: it has a % that is not followed by a valid escape."),
        ),
      );
    }
    // Any path no route matches renders our not-found page, with its 404.
    return withHsts(NextResponse.rewrite(new URL("/_malformed-address", request.url)));
  }

  if (pathname === PUBLISHED_PREFIX || pathname.startsWith(`${PUBLISHED_PREFIX}/`)) {
    if (!(await isPublishedAddress(pathname).catch(() => false))) {
      return withHsts(NextResponse.rewrite(new URL("/_malformed-address", request.url)));
    }
  }

  if (!api) {
    const refused = crossSiteRefusal(request);
    if (refused) return withHsts(page(refused.status, "Refused", refused.message));
  }

  const serverAction = request.headers.has("next-action");
  // A cached copy needs no database: what the proxy asks to find it is mostly kept in memory.
  const cached = !api && !serverAction && isRead(request) ? await cachedCopy(request) : null;
  if (cached) {
    // Next keeps a Cache-Control the answer already has instead of its own.
    return withHsts(NextResponse.rewrite(cached.url, { headers: { "cache-control": cached.cacheControl } }));
  }

  const needsDatabase = (!api && !serverAction) || pathname.startsWith("/api/auth/");
  if (needsDatabase && !(await databaseAnswers())) {
    const headers = { "retry-after": String(RETRY_AFTER_SECONDS) };
    const response = api
      ? json(databaseUnavailable(), headers)
      : page(503, "The database is not answering", `${DATABASE_DOWN_MESSAGE} This page reloads by itself.`, headers);
    return withHsts(response);
  }

  return withHsts(withoutForgedCallbackCookie(request));
}

const isRead = (request: NextRequest) => request.method === "GET" || request.method === "HEAD";

/** The cached copy's address and caching, or null; a failed lookup leaves the page to the live route. */
async function cachedCopy(request: NextRequest): Promise<{ url: URL; cacheControl: string } | null> {
  const { pathname, search, searchParams } = request.nextUrl;
  const target = await publishedAddress(pathname, searchParams).catch(() => null);
  return target ? { url: new URL(`${target.path}${search}`, request.url), cacheControl: target.cacheControl } : null;
}

export const config = {
  // Everything but the build's static files and the files in public/.
  matcher: ["/((?!_next/static|_next/image|icon\\.svg|robots\\.txt|favicon\\.ico).*)"],
};

/** Whether every %-escape of the path decodes: what Next's router does before any route runs. */
function decodable(pathname: string): boolean {
  try {
    for (const segment of pathname.split("/")) decodeURIComponent(segment);
    return true;
  } catch {
    return false;
  }
}

/**
 * next-auth checks its return-address cookie on every session read and answers one that is no
 * address with a 500, on every page. next-auth only ever sets a good one, so a bad one was
 * forged: it is dropped from the request and deleted from the browser.
 */
function withoutForgedCallbackCookie(request: NextRequest): NextResponse {
  const forged = request.cookies
    .getAll()
    .filter((c) => CALLBACK_COOKIE.test(c.name) && !usableCallbackUrl(c.value))
    .map((c) => c.name);
  if (forged.length === 0) return NextResponse.next();
  for (const name of forged) request.cookies.delete(name);
  const response = NextResponse.next({ request: { headers: request.headers } });
  for (const name of forged) response.cookies.delete(name);
  return response;
}

function withHsts<R extends Response>(response: R): R {
  // Only over https: a browser ignores it on http, and a local http setup must stay reachable.
  // A year, for this host only: whether sibling subdomains are https is not the app's to say.
  if (new URL(env().NEXTAUTH_URL).protocol === "https:") {
    response.headers.set("strict-transport-security", "max-age=31536000");
  }
  return response;
}

function json(error: AppError, headers: Record<string, string> = {}): NextResponse {
  return NextResponse.json(error.toResponseBody(), { status: error.status, headers });
}

const escapeHtml = (text: string) => text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/**
 * A page of ours for answers given before the app renders: plain HTML in the
 * app's colours, readable without scripts; a 503 reloads itself.
 */
function page(status: number, title: string, text: string, headers: Record<string, string> = {}): NextResponse {
  const refresh = status === 503 ? `<meta http-equiv="refresh" content="${RETRY_AFTER_SECONDS}">` : "";
  const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">${refresh}
<title>${escapeHtml(title)} · Framefork</title>
<style>body{margin:0;background:#0b0d12;color:#e8ecf4;font:16px/1.5 system-ui,sans-serif}main{max-width:36rem;margin:0 auto;padding:3rem 1rem}h1{font-size:1.5rem}a{color:#f5c451}</style>
</head><body><main role="alert"><h1>${escapeHtml(title)}</h1><p>${escapeHtml(text)}</p><p><a href="/">Framefork home</a></p></main></body></html>`;
  return new NextResponse(html, {
    status,
    headers: { "content-type": "text/html; charset=utf-8", "cache-control": "no-store", ...headers },
  });
}
