import type { Knex } from 'knex';

// One configuration for the app, the CLI, the start script and the tests: DATABASE_URL decides
// which database. scripts/start.mjs and scripts/test.mjs set it for their own clusters.
const connection = process.env.DATABASE_URL ?? 'postgres://proving_ground@127.0.0.1:54329/proving_ground';

const config: Knex.Config = {
  client: 'pg',
  connection,
  pool: { min: 0, max: Number(process.env.DATABASE_POOL_MAX ?? 10) },
  migrations: { directory: './migrations', extension: 'ts', loadExtensions: ['.ts'] },
  seeds: { directory: './seeds', extension: 'ts', loadExtensions: ['.ts'] },
};

export default config;
