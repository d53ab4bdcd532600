import type { NextConfig } from 'next';

const nextConfig: NextConfig = {
  // Knex would otherwise make the bundler resolve every SQL dialect driver it can load.
  serverExternalPackages: ['knex'],
  // The test command builds into its own folder so that it never clobbers the build `npm start` serves.
  distDir: process.env.NEXT_DIST_DIR ?? '.next',
  poweredByHeader: false,
  typedRoutes: false,
};

export default nextConfig;
