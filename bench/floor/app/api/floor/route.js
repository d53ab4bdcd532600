// POST /api/floor – one raw pg insert, the least a save can do.
import pg from 'pg';

const pool =
  globalThis.benchFloorPool ??
  new pg.Pool({ connectionString: process.env.DATABASE_URL, max: Number(process.env.DATABASE_POOL_MAX ?? 10) });
globalThis.benchFloorPool = pool;

export async function POST(request) {
  const body = await request.text();
  const { rows } = await pool.query('INSERT INTO bench_floor (body) VALUES ($1) RETURNING id', [body]);
  return Response.json({ id: rows[0].id });
}
