import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/knex';
import { revokeUserSessions } from '@/db/sessions';
import { AppError, notFound } from '@/lib/errors';
import type { Role } from '@/lib/roles';

export interface User {
  id: string;
  companyId: string;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  createdAt: Date;
}

export interface UserWithCompany extends User {
  companyName: string;
}

interface UserRow {
  id: string;
  company_id: string;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  created_at: Date;
  password_hash?: string;
  company_name?: string;
}

const COLUMNS = ['users.id', 'users.company_id', 'users.email', 'users.name', 'users.role', 'users.active', 'users.created_at'];

function toUser(row: UserRow): User {
  return {
    id: row.id,
    companyId: row.company_id,
    email: row.email,
    name: row.name,
    role: row.role,
    active: row.active,
    createdAt: row.created_at,
  };
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
export const isUuid = (id: string) => UUID.test(id);

/** For sign-in only: looks across companies, since an e-mail is unique everywhere. */
export async function getUserForSignIn({ email }: { email: string }): Promise<(UserWithCompany & { passwordHash: string }) | null> {
  const row = await db('users')
    .join('companies', 'companies.id', 'users.company_id')
    .whereRaw('lower(users.email) = lower(?)', [email])
    .first([...COLUMNS, 'users.password_hash', 'companies.name as company_name']);
  return row ? { ...toUser(row), companyName: row.company_name!, passwordHash: row.password_hash! } : null;
}

export async function listUsers({ companyId, roles }: { companyId: string; roles?: readonly Role[] }): Promise<User[]> {
  const query = db('users')
    .where('company_id', companyId)
    .orderBy([{ column: 'active', order: 'desc' }, 'name']);
  if (roles) query.whereIn('role', roles as Role[]);
  const rows: UserRow[] = await query.select(COLUMNS);
  return rows.map(toUser);
}

export async function getUser({ companyId, id }: { companyId: string; id: string }): Promise<User> {
  if (!isUuid(id)) throw notFound('That user');
  const row: UserRow | undefined = await db('users').where({ id, company_id: companyId }).first(COLUMNS);
  if (!row) throw notFound('That user');
  return toUser(row);
}

export async function createUser(input: {
  companyId: string;
  email: string;
  name: string;
  role: Role;
  passwordHash: string;
}): Promise<User> {
  try {
    const [row] = await db('users')
      .insert({
        company_id: input.companyId,
        email: input.email.toLowerCase(),
        name: input.name,
        role: input.role,
        password_hash: input.passwordHash,
      })
      .returning(COLUMNS.map((c) => c.replace('users.', '')));
    return toUser(row as UserRow);
  } catch (error) {
    if ((error as { code?: string }).code === '23505') {
      throw new AppError('conflict', 'A user with that e-mail address already exists.', {
        fieldErrors: { email: ['A user with that e-mail address already exists.'] },
      });
    }
    throw error;
  }
}

/**
 * An admin's change to a user. A role change, a deactivation or `revokeSessions` ends every open
 * session of the user in the same transaction, so no request can see the new row with an old session.
 */
export async function updateUser(
  {
    companyId,
    id,
    patch,
  }: {
    companyId: string;
    id: string;
    patch: { name?: string; role?: Role; active?: boolean; revokeSessions?: boolean };
  },
  trx: Knex = db,
): Promise<User> {
  if (!isUuid(id)) throw notFound('That user');
  return trx.transaction(async (t) => {
    const current: UserRow | undefined = await t('users').where({ id, company_id: companyId }).forUpdate().first(COLUMNS);
    if (!current) throw notFound('That user');
    const changes: Record<string, unknown> = { updated_at: t.fn.now() };
    if (patch.name !== undefined) changes.name = patch.name;
    if (patch.role !== undefined) changes.role = patch.role;
    if (patch.active !== undefined) changes.active = patch.active;
    const [row] = await t('users')
      .where({ id, company_id: companyId })
      .update(changes)
      .returning(COLUMNS.map((c) => c.replace('users.', '')));
    const roleChanged = patch.role !== undefined && patch.role !== current.role;
    if (patch.revokeSessions || patch.active === false || roleChanged) await revokeUserSessions({ userId: id }, t);
    return toUser(row as UserRow);
  });
}
