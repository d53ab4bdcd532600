import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/knex';
import type { UserWithCompany } from '@/db/users';
import type { Role } from '@/lib/roles';

// A session is live while its row is not revoked and not expired and its user is active. The
// times come from the database clock, so every app server agrees on them.

export const USER_AGENT_MAX = 300;

/** Expired rows are kept this long (for a look at recent sign-ins), then deleted on a later sign-in. */
const KEEP_EXPIRED = '1 day';
/** At most this many old rows go per sign-in, so the clean-up never makes a sign-in slow. */
const DELETE_BATCH = 500;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The header as stored: trimmed, at most 300 characters, null when empty. */
export function storedUserAgent(userAgent: string | null | undefined): string | null {
  let value = (userAgent ?? '').trim().slice(0, USER_AGENT_MAX);
  // Never leave half of a surrogate pair at the cut.
  if (/[\uD800-\uDBFF]$/.test(value)) value = value.slice(0, -1);
  return value.trimEnd() || null;
}

export async function createSession(
  { userId, companyId, userAgent, ttlSeconds }: { userId: string; companyId: string; userAgent: string | null; ttlSeconds: number },
  trx: Knex = db,
): Promise<string> {
  const [row] = await trx('sessions')
    .insert({
      user_id: userId,
      company_id: companyId,
      user_agent: storedUserAgent(userAgent),
      expires_at: trx.raw('now() + make_interval(secs => ?)', [ttlSeconds]),
    })
    .returning('id');
  return row.id;
}

interface LiveRow {
  id: string;
  company_id: string;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  created_at: Date;
  company_name: string;
}

/**
 * The user of a live session with their company, in one query (it runs on every request): not
 * revoked, not expired, the user active and still in the company the session began in.
 */
export async function getLiveSessionUser(
  { sessionId }: { sessionId: string },
  trx: Knex = db,
): Promise<(UserWithCompany & { sessionId: string }) | null> {
  if (!UUID.test(sessionId)) return null;
  const row: LiveRow | undefined = await trx('sessions as s')
    .join('users', function () {
      this.on('users.id', '=', 's.user_id').andOn('users.company_id', '=', 's.company_id');
    })
    .join('companies', 'companies.id', 's.company_id')
    .where('s.id', sessionId)
    .whereNull('s.revoked_at')
    .where('s.expires_at', '>', trx.fn.now())
    .where('users.active', true)
    .first(
      'users.id',
      'users.company_id',
      'users.email',
      'users.name',
      'users.role',
      'users.active',
      'users.created_at',
      'companies.name as company_name',
    );
  if (!row) return null;
  return {
    id: row.id,
    companyId: row.company_id,
    email: row.email,
    name: row.name,
    role: row.role,
    active: row.active,
    createdAt: row.created_at,
    companyName: row.company_name,
    sessionId,
  };
}

/** Ends one session; a second call, an unknown id or a malformed one change nothing. */
export async function revokeSession({ sessionId }: { sessionId: string }, trx: Knex = db): Promise<boolean> {
  if (!UUID.test(sessionId)) return false;
  const count = await trx('sessions').where({ id: sessionId }).whereNull('revoked_at').update({ revoked_at: trx.fn.now() });
  return count > 0;
}

/** Ends every session of the user that is still open; answers how many it ended. */
export async function revokeUserSessions({ userId }: { userId: string }, trx: Knex = db): Promise<number> {
  return trx('sessions')
    .where({ user_id: userId })
    .whereNull('revoked_at')
    .where('expires_at', '>', trx.fn.now())
    .update({ revoked_at: trx.fn.now() });
}

/** Deletes rows that expired more than a day ago, a bounded batch at a time (run on sign-in). */
export async function deleteOldSessions(trx: Knex = db): Promise<number> {
  return trx('sessions')
    .whereIn(
      'id',
      trx('sessions')
        .select('id')
        .where('expires_at', '<', trx.raw(`now() - interval '${KEEP_EXPIRED}'`))
        .limit(DELETE_BATCH),
    )
    .delete();
}
