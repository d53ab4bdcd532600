import type { NextConfig } from 'next';

// Headers for what the proxy does not see (the build's static files); pages, API answers and
// everything else get theirs, with a per-request CSP nonce, in proxy.ts.
const STATIC_HEADERS = [
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'Referrer-Policy', value: 'same-origin' },
  { key: 'Content-Security-Policy', value: "default-src 'none'; frame-ancestors 'none'" },
];

const nextConfig: NextConfig = {
  // Knex would otherwise make the bundler resolve every SQL dialect driver it can load.
  serverExternalPackages: ['knex'],
  // The test command builds into its own folder so that it never clobbers the build `npm start` serves.
  distDir: process.env.NEXT_DIST_DIR ?? '.next',
  poweredByHeader: false,
  typedRoutes: false,
  experimental: { serverActions: { bodySizeLimit: '1mb' } },
  async headers() {
    return [{ source: '/_next/static/:path*', headers: STATIC_HEADERS }];
  },
};

export default nextConfig;
