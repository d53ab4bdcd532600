import type { Knex } from 'knex';

// One configuration for the app, the CLI, the start script and the tests: DATABASE_URL decides
// which database. scripts/start.mjs and scripts/test.mjs set it for their own clusters.
const connectionString = process.env.DATABASE_URL ?? 'postgres://proving_ground@127.0.0.1:54329/proving_ground';

const ms = (name: string, fallback: number) => {
  const value = Number(process.env[name]);
  return Number.isFinite(value) && value > 0 ? value : fallback;
};

// Under load a request must fail fast with 503 rather than hang: waiting for a pooled connection,
// for a row lock, or for one statement is each bounded well under the 2 s a client may wait, and a
// transaction left idle (a crashed handler) cannot hold its locks for long.
const config: Knex.Config = {
  client: 'pg',
  connection: {
    connectionString,
    lock_timeout: ms('DATABASE_LOCK_TIMEOUT_MS', 1000),
    statement_timeout: ms('DATABASE_STATEMENT_TIMEOUT_MS', 5000),
    idle_in_transaction_session_timeout: ms('DATABASE_IDLE_IN_TRANSACTION_TIMEOUT_MS', 10_000),
    connectionTimeoutMillis: ms('DATABASE_CONNECT_TIMEOUT_MS', 1500),
  } as Knex.PgConnectionConfig,
  pool: { min: 0, max: ms('DATABASE_POOL_MAX', 10) },
  acquireConnectionTimeout: ms('DATABASE_ACQUIRE_TIMEOUT_MS', 1500),
  migrations: { directory: './migrations', extension: 'ts', loadExtensions: ['.ts'] },
  seeds: { directory: './seeds', extension: 'ts', loadExtensions: ['.ts'] },
};

export default config;
