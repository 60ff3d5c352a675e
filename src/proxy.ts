import { NextResponse, type NextRequest } from "next/server";
import { CALLBACK_COOKIE, usableCallbackUrl } from "@/lib/callback-url";

/** Runs before every page and route: requests that would fail inside Next or next-auth are settled here. */
export function proxy(request: NextRequest) {
  if (!decodes(request.nextUrl.pathname)) return notFound(request);
  return withoutForgedCallbackCookie(request);
}

/**
 * An address whose percent escapes do not decode (a stray "%E0") names nothing. Next's router
 * answers such a dynamic segment with a 500 in production (vercel/next.js#92527), so it is
 * answered here, before routing: the API's JSON "not found", or the not-found page.
 */
function notFound(request: NextRequest) {
  if (request.nextUrl.pathname.startsWith("/api/"))
    return Response.json(
      { error: { code: "not_found", message: "There is nothing at this address." } },
      { status: 404 },
    );
  return NextResponse.rewrite(new URL("/_not-found", request.url));
}

function decodes(pathname: string): boolean {
  try {
    decodeURIComponent(pathname);
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
function withoutForgedCallbackCookie(request: NextRequest) {
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

export const config = {
  // Everything but Next's own files.
  matcher: ["/((?!_next/static|_next/image).*)"],
};
