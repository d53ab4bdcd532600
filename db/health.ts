import 'server-only';
import { db } from '@/db/knex';

export async function pingDatabase(timeoutMs = 2000): Promise<boolean> {
  try {
    await Promise.race([db.raw('select 1'), new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), timeoutMs))]);
    return true;
  } catch {
    return false;
  }
}
