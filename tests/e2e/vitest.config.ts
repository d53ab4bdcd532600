import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

// Vitest sets process.env.BASE_URL to Vite's base path ('/') inside the test workers, so the
// app's address that scripts/test.mjs passes in BASE_URL is handed on under another name.
const appUrl = process.env.BASE_URL && process.env.BASE_URL !== '/' ? process.env.BASE_URL : '';

// The HTTP API and browser tests: run by scripts/test.mjs against the built app it serves at
// BASE_URL. One file at a time, since they share the server, the database and its rate limits.
export default defineConfig({
  root: fileURLToPath(new URL('../../', import.meta.url)),
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('../../', import.meta.url)),
      'server-only': fileURLToPath(new URL('../support/empty.ts', import.meta.url)),
    },
  },
  test: {
    globals: true,
    environment: 'node',
    env: { E2E_BASE_URL: appUrl },
    include: ['tests/e2e/**/*.test.ts', 'tests/api/**/*.test.ts'],
    fileParallelism: false,
    testTimeout: 60_000,
    hookTimeout: 120_000,
  },
});
