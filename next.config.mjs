// Browser security headers sent with every response: no content-type sniffing, no framing by any site, the
// referrer only to this site. API answers get a policy that renders nothing; pages get theirs, with a nonce,
// in proxy.ts (lib/api/security-headers.ts).
const COMMON_SECURITY_HEADERS = [
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'Referrer-Policy', value: 'same-origin' },
];
const API_CONTENT_SECURITY_POLICY = "default-src 'none'; frame-ancestors 'none'";

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Sequelize and sqlite3 load native code and dynamic requires that the bundler cannot follow.
  serverExternalPackages: ['sequelize', 'sqlite3', 'piscina', 'multer', 'nodemailer', 'smtp-server', 'mailparser', 'rate-limiter-flexible', 'bullmq', 'ioredis', '@aws-sdk/client-s3', '@aws-sdk/lib-storage'],
  poweredByHeader: false,
  // Separate build folders let several builds (tests, a developer's server) coexist.
  distDir: process.env.NEXT_DIST_DIR || '.next',
  async headers() {
    return [
      { source: '/:path*', headers: COMMON_SECURITY_HEADERS },
      { source: '/api/:path*', headers: [{ key: 'Content-Security-Policy', value: API_CONTENT_SECURITY_POLICY }] },
    ];
  },
};
export default nextConfig;
