import 'server-only';
import { db } from '@/db/knex';
import { AppError, notFound } from '@/lib/errors';
import type { Role } from '@/lib/roles';

export interface User {
  id: string;
  companyId: string;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  sessionVersion: number;
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
  session_version: number;
  created_at: Date;
  password_hash?: string;
  company_name?: string;
}

const COLUMNS = [
  'users.id',
  'users.company_id',
  'users.email',
  'users.name',
  'users.role',
  'users.active',
  'users.session_version',
  'users.created_at',
];

/** The user columns a session check reads (with `companies.name as company_name`). */
export const SESSION_USER_COLUMNS: readonly string[] = COLUMNS;

export function toSessionUser(row: UserRow): UserWithCompany {
  return { ...toUser(row), companyName: row.company_name! };
}

function toUser(row: UserRow): User {
  return {
    id: row.id,
    companyId: row.company_id,
    email: row.email,
    name: row.name,
    role: row.role,
    active: row.active,
    sessionVersion: row.session_version,
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

export async function updateUser({
  companyId,
  id,
  patch,
}: {
  companyId: string;
  id: string;
  patch: { name?: string; role?: Role; active?: boolean; revokeSessions?: boolean };
}): Promise<User> {
  await getUser({ companyId, id });
  const changes: Record<string, unknown> = { updated_at: db.fn.now() };
  if (patch.name !== undefined) changes.name = patch.name;
  if (patch.role !== undefined) changes.role = patch.role;
  if (patch.active !== undefined) changes.active = patch.active;
  // A role change, a deactivation or an explicit revoke ends every open session of the user.
  if (patch.revokeSessions || patch.active === false || patch.role !== undefined) {
    changes.session_version = db.raw('session_version + 1');
  }
  const [row] = await db('users')
    .where({ id, company_id: companyId })
    .update(changes)
    .returning(COLUMNS.map((c) => c.replace('users.', '')));
  return toUser(row as UserRow);
}
