import 'server-only';
import { db } from '@/db/knex';

/** Failed sign-ins under `key` within the window, and when the oldest of them leaves it. */
export async function countRecentFailures({
  key,
  windowMs,
}: {
  key: string;
  windowMs: number;
}): Promise<{ count: number; oldest: Date | null }> {
  const since = new Date(Date.now() - windowMs);
  const row = await db('sign_in_failures')
    .where('key', key)
    .andWhere('at', '>', since)
    .first(db.raw('count(*)::int as count'), db.raw('min(at) as oldest'));
  return { count: row?.count ?? 0, oldest: row?.oldest ?? null };
}

export async function recordFailures({ keys }: { keys: string[] }): Promise<void> {
  await db('sign_in_failures').insert(keys.map((key) => ({ key })));
  // Keep the table small: nothing older than a day matters to any window we use.
  await db('sign_in_failures')
    .where('at', '<', new Date(Date.now() - 24 * 3600_000))
    .delete();
}
