import { NextResponse, type NextRequest } from "next/server";

const SESSION_COOKIE = "heatpath_session";
const PUBLIC_PREFIXES = ["/sign-in", "/invite/", "/api/", "/_next/", "/favicon"];

/**
 * Only sends visitors without a session cookie to sign-in. Whether the cookie
 * is valid, and what its owner may do, is decided by the services.
 */
export function proxy(request: NextRequest) {
  const { pathname, search } = request.nextUrl;
  if (PUBLIC_PREFIXES.some((p) => pathname.startsWith(p))) return NextResponse.next();
  if (request.cookies.has(SESSION_COOKIE)) return NextResponse.next();
  const url = request.nextUrl.clone();
  url.pathname = "/sign-in";
  url.search = pathname === "/" ? "" : `?next=${encodeURIComponent(pathname + search)}`;
  return NextResponse.redirect(url);
}

export const config = { matcher: ["/((?!_next/static|_next/image|favicon.ico).*)"] };
