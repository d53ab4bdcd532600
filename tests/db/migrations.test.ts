// @vitest-environment node
import { randomBytes } from 'node:crypto';
import { readdirSync } from 'node:fs';
import path from 'node:path';
import knexFactory, { type Knex } from 'knex';
import config from '@/knexfile';

// Migrations up, all the way down, and up again, in a scratch database of their own so that the
// seeded test database is never touched.
const adminUrl = process.env.TEST_PG_ADMIN_URL;
const scratch = `pg_migrations_${randomBytes(4).toString('hex')}`;
const FOUNDATION_TABLES = ['companies', 'sign_in_failures', 'users'];

// Knex would load the files with Node's own loader, which cannot read TypeScript; this source
// takes the same directory and extensions from the knexfile and imports through vitest instead.
const { directory = './migrations', loadExtensions = ['.ts'] } = config.migrations as { directory?: string; loadExtensions?: string[] };
const migrationSource: Knex.MigrationSource<string> = {
  async getMigrations() {
    return readdirSync(directory)
      .filter((file) => loadExtensions.some((ext) => file.endsWith(ext)))
      .sort();
  },
  getMigrationName: (file) => file,
  getMigration: (file) => import(/* @vite-ignore */ path.resolve(directory, file)),
};

let admin: Knex;
let db: Knex;

async function publicTables(): Promise<string[]> {
  const rows: { table_name: string }[] = await db('information_schema.tables')
    .where({ table_schema: 'public', table_type: 'BASE TABLE' })
    .select('table_name');
  return rows
    .map((r) => r.table_name)
    .filter((name) => !name.startsWith('knex_migrations'))
    .sort();
}

describe('migrations', () => {
  beforeAll(async () => {
    if (!adminUrl) throw new Error('TEST_PG_ADMIN_URL is not set; run through scripts/test.mjs.');
    admin = knexFactory({ client: 'pg', connection: adminUrl, pool: { min: 0, max: 1 } });
    await admin.raw(`CREATE DATABASE ${scratch}`);
    const url = new URL(adminUrl);
    url.pathname = `/${scratch}`;
    db = knexFactory({ client: 'pg', connection: url.toString(), pool: { min: 0, max: 2 }, migrations: { migrationSource } });
  });

  afterAll(async () => {
    await db?.destroy();
    await admin?.raw(`DROP DATABASE IF EXISTS ${scratch} WITH (FORCE)`);
    await admin?.destroy();
  });

  it('starts from an empty database', async () => {
    expect(await publicTables()).toEqual([]);
  });

  it('migrates to the latest version and creates the foundation tables', async () => {
    const [, applied] = await db.migrate.latest();
    expect(applied.length).toBeGreaterThan(0);
    const tables = await publicTables();
    for (const table of FOUNDATION_TABLES) expect(tables).toContain(table);
    const [, pending] = await db.migrate.list();
    expect(pending).toEqual([]);
  });

  it('enforces the user constraints the application relies on', async () => {
    const [company] = await db('companies')
      .insert({ name: 'Scratch Co', office_email: 'office@scratch.test' })
      .returning(['id', 'display_units']);
    expect(company.display_units).toBe('us');
    const user = { company_id: company.id, name: 'A', role: 'technician', password_hash: 'x' };
    const [created] = await db('users')
      .insert({ ...user, email: 'Same@Scratch.test' })
      .returning(['active', 'session_version']);
    expect(created).toEqual({ active: true, session_version: 1 });
    // An e-mail is unique regardless of case.
    await expect(db('users').insert({ ...user, email: 'same@scratch.TEST' })).rejects.toMatchObject({ code: '23505' });
    // Only the five roles.
    await expect(db('users').insert({ ...user, email: 'b@scratch.test', role: 'owner' })).rejects.toMatchObject({ code: '23514' });
    await expect(db('companies').insert({ name: 'X', office_email: 'x@x.test', display_units: 'imperial' })).rejects.toMatchObject({
      code: '23514',
    });
    // Deleting a company removes its users.
    await db('companies').where({ id: company.id }).delete();
    expect(await db('users').count<{ count: string }[]>('* as count')).toEqual([{ count: '0' }]);
  });

  it('rolls everything back and leaves no table behind', async () => {
    await db.migrate.rollback(undefined, true);
    expect(await publicTables()).toEqual([]);
    const [done] = await db.migrate.list();
    expect(done).toEqual([]);
  });

  it('migrates again after a full rollback', async () => {
    await db.migrate.latest();
    const tables = await publicTables();
    for (const table of FOUNDATION_TABLES) expect(tables).toContain(table);
  });
});
