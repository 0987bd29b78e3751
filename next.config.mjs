/**
 * The Content-Security-Policy (nonce-based) and, in production, Strict-Transport-Security
 * are set per request in proxy.ts (lib/security-headers.ts); the static headers here go on
 * every response, including the static files the proxy does not see.
 */

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Native and server-only packages stay outside the bundles (pg-hstore, sqlite3 bindings, numeric's globals).
  serverExternalPackages: ["sequelize", "sqlite3", "pg", "pg-hstore", "numeric", "smtp-server", "nodemailer", "mailparser", "umzug", "piscina"],
  poweredByHeader: false,
  // The app shows no remote or optimised images: the optimiser endpoint is off, so /_next/image answers 4xx.
  images: { unoptimized: true },
  // forbidden() in pages renders app/forbidden.tsx with status 403 (a reviewer opening /cases/new).
  experimental: { authInterrupts: true },
  // `npm test` type-checks the whole project (tests included) with tsc first; the build need not do it again.
  typescript: { ignoreBuildErrors: true },
  async headers() {
    return [
      {
        source: "/:path*",
        headers: [
          { key: "X-Content-Type-Options", value: "nosniff" },
          { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
          { key: "X-Frame-Options", value: "DENY" },
          { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=()" },
        ],
      },
    ];
  },
};

export default nextConfig;
