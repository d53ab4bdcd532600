import type { NextConfig } from 'next';

const nextConfig: NextConfig = {
  // Knex would otherwise make the bundler resolve every SQL dialect driver it can load.
  serverExternalPackages: ['knex'],
  poweredByHeader: false,
  typedRoutes: false,
};

export default nextConfig;
