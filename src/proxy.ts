import { NextResponse, type NextRequest } from "next/server";

/** Runs before every page and route: requests that would fail inside Next are settled here. */
export function proxy(request: NextRequest) {
  if (!decodes(request.nextUrl.pathname)) return notFound(request);
  return NextResponse.next();
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

export const config = {
  // Everything but Next's own files.
  matcher: ["/((?!_next/static|_next/image).*)"],
};
