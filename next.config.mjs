/** @type {import('next').NextConfig} */
const nextConfig = {
  // knex and mysql2 load drivers dynamically; bundling them breaks the Turbopack build.
  serverExternalPackages: ['knex', 'mysql2', 'bcryptjs', 'nodemailer'],
  // `npm test` builds into its own folder so it never clobbers the build `npm start` serves.
  distDir: process.env.TAUFORGE_DIST_DIR || '.next',
  poweredByHeader: false,
  reactStrictMode: true,
};

export default nextConfig;
