const development = process.env.NODE_ENV === "development";

/** The app loads nothing from elsewhere; the dev server alone needs eval for fast refresh. */
const csp = [
  "default-src 'self'",
  `script-src 'self' 'unsafe-inline'${development ? " 'unsafe-eval'" : ""}`,
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "connect-src 'self'",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join("; ");

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Native and server-only packages stay outside the bundles (pg-hstore, sqlite3 bindings, numeric's globals).
  serverExternalPackages: ["sequelize", "sqlite3", "pg", "pg-hstore", "numeric", "smtp-server", "nodemailer", "mailparser", "umzug"],
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
          { key: "Content-Security-Policy", value: csp },
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
