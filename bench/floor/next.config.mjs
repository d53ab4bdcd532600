import path from 'node:path';

// The bench's floor: the same framework and server as the app, with one route handler doing one raw
// insert. Built from inside the project so Turbopack finds the project's node_modules.
const root = path.resolve(import.meta.dirname, '..', '..');

const config = {
  distDir: process.env.FLOOR_DIST_DIR ?? '.next-floor',
  serverExternalPackages: ['pg'],
  turbopack: { root },
  poweredByHeader: false,
};

export default config;
