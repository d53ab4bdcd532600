import 'server-only';
import knexFactory, { type Knex } from 'knex';
import config from '@/knexfile';

// One pool per process, kept on globalThis so that dev-server reloads do not open new pools.
const globalForKnex = globalThis as unknown as { provingGroundKnex?: Knex };

export const db: Knex = globalForKnex.provingGroundKnex ?? knexFactory(config);
globalForKnex.provingGroundKnex = db;
