// POST /api/floor – one raw pg insert and a small JSON answer: the least a save over HTTP can cost.
import pg from 'pg';

// One pool per process, sized like the app's (DATABASE_POOL_MAX, default 10), kept on globalThis so
// that a second evaluation of the module does not open a second pool.
const pool =
  globalThis.benchFloorPool ??
  new pg.Pool({ connectionString: process.env.DATABASE_URL, max: Number(process.env.DATABASE_POOL_MAX ?? 10) });
globalThis.benchFloorPool = pool;

// The floor's own table, created once per process at the first insert (not at import: the build
// imports this module too, with no database).
function ready() {
  globalThis.benchFloorReady ??= pool
    .query('CREATE TABLE IF NOT EXISTS bench_floor (id bigserial PRIMARY KEY, body jsonb NOT NULL, at timestamptz NOT NULL DEFAULT now())')
    .catch((error) => {
      globalThis.benchFloorReady = undefined;
      throw error;
    });
  return globalThis.benchFloorReady;
}

export const dynamic = 'force-dynamic';

export async function POST(request) {
  let body;
  try {
    body = await request.json();
  } catch {
    return Response.json({ error: { code: 'bad_request', message: 'The body is not JSON.' } }, { status: 400 });
  }
  await ready();
  const { rows } = await pool.query('INSERT INTO bench_floor (body) VALUES ($1) RETURNING id', [body]);
  return Response.json({ id: rows[0].id }, { status: 201 });
}
