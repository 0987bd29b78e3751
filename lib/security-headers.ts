/**
 * The Content-Security-Policy and Strict-Transport-Security headers, set per request by
 * proxy.ts (the framework's nonce-based CSP: Next reads the nonce from the request's CSP
 * header and puts it on its own scripts). No 'unsafe-inline' scripts; development alone adds
 * 'unsafe-eval' (React's dev tooling). Styles keep 'unsafe-inline': chart and layout code
 * sets style attributes, which a nonce cannot cover. Edge-safe: no Node imports.
 */
export function contentSecurityPolicy(nonce: string, options: { development: boolean; production: boolean }): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${options.development ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
    ...(options.production ? ["upgrade-insecure-requests"] : []),
  ].join("; ");
}

/** Production mode sits behind HTTPS: browsers are told to use nothing else for two years. */
export const STRICT_TRANSPORT_SECURITY = "max-age=63072000; includeSubDomains";

/** A fresh, unguessable nonce per response (128 bits, base64). */
export function newNonce(): string {
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  return btoa(String.fromCharCode(...bytes));
}
