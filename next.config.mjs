/** @type {import('next').NextConfig} */
const nextConfig = {
  serverExternalPackages: ["sequelize", "sqlite3", "numeric", "smtp-server", "nodemailer", "umzug"],
  poweredByHeader: false,
};

export default nextConfig;
