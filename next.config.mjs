/** @type {import('next').NextConfig} */
const nextConfig = {
  // Sequelize and sqlite3 load native code and dynamic requires that the bundler cannot follow.
  serverExternalPackages: ['sequelize', 'sqlite3', 'piscina', 'multer', 'nodemailer', 'smtp-server', 'rate-limiter-flexible'],
  poweredByHeader: false,
  // Separate build folders let several builds (tests, a developer's server) coexist.
  distDir: process.env.NEXT_DIST_DIR || '.next',
};
export default nextConfig;
