import type { NextConfig } from 'next';

// Headers for what the proxy does not see: the build's static files, the image path, and the JSON
// API (the proxy costs a route handler about 2 ms a request, a fifth of a save; the API needs no
// nonce and no sign-in redirect, and its adapters refuse bodies over 1 MB themselves). Pages get
// theirs, with a per-request CSP nonce, in proxy.ts. Nothing here is a document that runs scripts,
// so the policy allows nothing at all.
const STATIC_HEADERS = [
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'Referrer-Policy', value: 'same-origin' },
  {
    key: 'Content-Security-Policy',
    value: "default-src 'none'; object-src 'none'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'",
  },
];

const nextConfig: NextConfig = {
  // Knex would otherwise make the bundler resolve every SQL dialect driver it can load.
  serverExternalPackages: ['knex'],
  // The test command builds into its own folder so that it never clobbers the build `npm start` serves.
  distDir: process.env.NEXT_DIST_DIR ?? '.next',
  poweredByHeader: false,
  typedRoutes: false,
  // The app shows no raster images (icons and charts are SVG); left on, the optimizer at
  // /_next/image fetched any local path through the proxy and answered 500. Off, that path is a 404.
  images: { unoptimized: true },
  experimental: {
    // Next 16 still keeps this under `experimental`. The proxy refuses a declared length over 1 MB
    // (413) and a page body without one (411) first; this is the framework's own count.
    serverActions: { bodySizeLimit: '1mb' },
    // proxyClientMaxBodySize stays at its default (10 MB): past it the framework cuts the body
    // short silently, and a cut-off body must not reach an adapter that would count it as under 1 MB.
  },
  async headers() {
    return [
      { source: '/_next/static/:path*', headers: STATIC_HEADERS },
      { source: '/_next/image', headers: STATIC_HEADERS },
      { source: '/api/:path*', headers: [...STATIC_HEADERS, { key: 'Cache-Control', value: 'no-store' }] },
    ];
  },
};

export default nextConfig;
