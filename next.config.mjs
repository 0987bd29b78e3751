/** @type {import('next').NextConfig} */
const nextConfig = {
  // Native and server-only packages stay outside the bundles (pg-hstore, sqlite3 bindings, numeric's globals).
  serverExternalPackages: ["sequelize", "sqlite3", "numeric", "smtp-server", "nodemailer", "umzug"],
  poweredByHeader: false,
  // `npm test` type-checks the whole project (tests included) with tsc first; the build need not do it again.
  typescript: { ignoreBuildErrors: true },
};

export default nextConfig;
