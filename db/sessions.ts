import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/knex';
import { isUuid, SESSION_USER_COLUMNS, toSessionUser, type UserWithCompany } from '@/db/users';

export async function createSession(
  {
    userId,
    companyId,
    userVersion,
    userAgent,
    ttlSeconds,
  }: { userId: string; companyId: string; userVersion: number; userAgent: string | null; ttlSeconds: number },
  trx: Knex = db,
): Promise<string> {
  const [row] = await trx('sessions')
    .insert({
      user_id: userId,
      company_id: companyId,
      user_version: userVersion,
      user_agent: userAgent ? userAgent.slice(0, 300) : null,
      expires_at: new Date(Date.now() + ttlSeconds * 1000),
    })
    .returning('id');
  return row.id;
}

/** The user of a live session (not revoked, not expired, not ended by a version bump, user active), in one query. */
export async function getLiveSessionUser(
  { sessionId }: { sessionId: string },
  trx: Knex = db,
): Promise<(UserWithCompany & { sessionId: string }) | null> {
  if (!isUuid(sessionId)) return null;
  const row = await trx('sessions as s')
    .join('users', 'users.id', 's.user_id')
    .join('companies', 'companies.id', 'users.company_id')
    .where('s.id', sessionId)
    .whereNull('s.revoked_at')
    .where('s.expires_at', '>', trx.fn.now())
    .where('users.active', true)
    .whereRaw('s.user_version = users.session_version')
    .first([...SESSION_USER_COLUMNS, 'companies.name as company_name']);
  return row ? { ...toSessionUser(row), sessionId } : null;
}

export async function revokeSession({ sessionId }: { sessionId: string }, trx: Knex = db): Promise<void> {
  if (!isUuid(sessionId)) return;
  await trx('sessions').where({ id: sessionId }).whereNull('revoked_at').update({ revoked_at: trx.fn.now() });
}

/** Ends every session of the user at once (the version bump) and marks the rows, for the record. */
export async function revokeUserSessions({ userId }: { userId: string }, trx: Knex = db): Promise<void> {
  await trx('users')
    .where({ id: userId })
    .update({ session_version: trx.raw('session_version + 1') });
  await trx('sessions').where({ user_id: userId }).whereNull('revoked_at').update({ revoked_at: trx.fn.now() });
}

/** Rows that can no longer matter (expired a day ago); cheap, run on sign-in. */
export async function deleteOldSessions(trx: Knex = db): Promise<void> {
  await trx('sessions')
    .where('expires_at', '<', new Date(Date.now() - 24 * 3600_000))
    .delete();
}
