import { NextResponse, type NextRequest } from "next/server";
import { contentSecurityPolicy, newNonce, STRICT_TRANSPORT_SECURITY } from "@/lib/security-headers";

const SESSION_COOKIE = "heatpath_session";
const PUBLIC_PREFIXES = ["/sign-in", "/invite/", "/api/", "/_next/", "/favicon"];

/**
 * Sends visitors without a session cookie to sign-in (whether the cookie is valid, and what
 * its owner may do, is decided by the services), and gives every response its security
 * headers: a nonce-based Content-Security-Policy (the nonce also goes on the request, where
 * Next reads it for its scripts) and, in production mode, Strict-Transport-Security.
 */
export function proxy(request: NextRequest) {
  const nonce = newNonce();
  const production = process.env.HEATPATH_MODE === "production";
  const csp = contentSecurityPolicy(nonce, { development: process.env.NODE_ENV === "development", production });
  const { pathname, search } = request.nextUrl;
  let response: NextResponse;
  if (PUBLIC_PREFIXES.some((p) => pathname.startsWith(p)) || request.cookies.has(SESSION_COOKIE)) {
    const headers = new Headers(request.headers);
    headers.set("x-nonce", nonce);
    headers.set("content-security-policy", csp);
    response = NextResponse.next({ request: { headers } });
  } else {
    const url = request.nextUrl.clone();
    url.pathname = "/sign-in";
    url.search = pathname === "/" ? "" : `?next=${encodeURIComponent(pathname + search)}`;
    response = NextResponse.redirect(url);
  }
  response.headers.set("content-security-policy", csp);
  if (production) response.headers.set("strict-transport-security", STRICT_TRANSPORT_SECURITY);
  return response;
}

export const config = { matcher: ["/((?!_next/static|_next/image|favicon.ico).*)"] };
