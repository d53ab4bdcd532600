// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { db } from '@/db/knex';
import { createUser, getUser, getUserForSignIn, listUsers, updateUser } from '@/db/users';
import { AppError } from '@/lib/errors';

// Two companies made for this file, so the seeded demo data is neither read nor changed; deleting
// them at the end removes their users too (ON DELETE CASCADE).
const tag = randomUUID().slice(0, 8);
let companyA: string;
let companyB: string;

async function makeCompany(name: string): Promise<string> {
  const [row] = await db('companies')
    .insert({ name, office_email: `office-${tag}@${name.toLowerCase()}.test` })
    .returning('id');
  return row.id;
}

const newUser = (companyId: string, local: string, role: 'apprentice' | 'technician' | 'lead' | 'trainer' | 'admin' = 'technician') =>
  createUser({ companyId, email: `${local}-${tag}@users-test.test`, name: `${local} ${tag}`, role, passwordHash: 'not-a-real-hash' });

async function appError(promise: Promise<unknown>): Promise<AppError> {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(AppError);
  return error as AppError;
}

beforeAll(async () => {
  if (!process.env.DATABASE_URL) throw new Error('DATABASE_URL is not set; run through scripts/test.mjs.');
  companyA = await makeCompany('Alpha');
  companyB = await makeCompany('Bravo');
});

afterAll(async () => {
  await db('companies').whereIn('id', [companyA, companyB].filter(Boolean)).delete();
  await db.destroy();
});

describe('createUser', () => {
  it('stores the user with a lower-cased e-mail, active', async () => {
    const user = await createUser({
      companyId: companyA,
      email: `Mixed.Case-${tag}@Users-Test.TEST`,
      name: 'Mixed Case',
      role: 'lead',
      passwordHash: 'h',
    });
    expect(user).toMatchObject({
      companyId: companyA,
      email: `mixed.case-${tag}@users-test.test`,
      name: 'Mixed Case',
      role: 'lead',
      active: true,
    });
    expect(user.id).toMatch(/^[0-9a-f-]{36}$/);
    expect(user.createdAt).toBeInstanceOf(Date);
    // The hash never comes back from the general queries.
    expect(Object.keys(user)).not.toContain('passwordHash');
    const row = await db('users').where({ id: user.id }).first();
    expect(row.password_hash).toBe('h');
  });

  it('refuses an e-mail that exists in any company, whatever its case, as a conflict', async () => {
    await newUser(companyA, 'dupe');
    const error = await appError(
      createUser({ companyId: companyB, email: `DUPE-${tag}@USERS-TEST.TEST`, name: 'Other', role: 'technician', passwordHash: 'h' }),
    );
    expect(error.code).toBe('conflict');
    expect(error.status).toBe(409);
    expect(error.fieldErrors?.email).toEqual(['A user with that e-mail address already exists.']);
    expect(
      await db('users')
        .whereRaw('lower(email) = ?', [`dupe-${tag}@users-test.test`])
        .count<{ count: string }[]>('* as count'),
    ).toEqual([{ count: '1' }]);
  });
});

describe('listUsers', () => {
  it("lists only the company's own users, active ones first", async () => {
    const a1 = await newUser(companyA, 'list-a1');
    const a2 = await newUser(companyA, 'list-a2', 'apprentice');
    const b1 = await newUser(companyB, 'list-b1');
    await db('users').where({ id: a1.id }).update({ active: false });

    const listA = await listUsers({ companyId: companyA });
    const idsA = listA.map((u) => u.id);
    expect(idsA).toEqual(expect.arrayContaining([a1.id, a2.id]));
    expect(idsA).not.toContain(b1.id);
    expect(listA.every((u) => u.companyId === companyA)).toBe(true);
    const firstInactive = listA.findIndex((u) => !u.active);
    expect(listA.slice(firstInactive).every((u) => !u.active)).toBe(true);

    expect((await listUsers({ companyId: companyB })).map((u) => u.id)).toEqual([b1.id]);
  });

  it('filters by role when asked', async () => {
    const apprentices = await listUsers({ companyId: companyA, roles: ['apprentice'] });
    expect(apprentices.length).toBeGreaterThan(0);
    expect(apprentices.every((u) => u.role === 'apprentice')).toBe(true);
  });
});

describe('getUser', () => {
  it('finds a user of the same company', async () => {
    const user = await newUser(companyA, 'get-own');
    expect(await getUser({ companyId: companyA, id: user.id })).toEqual(user);
  });

  it("answers not_found for another company's user", async () => {
    const other = await newUser(companyB, 'get-other');
    const error = await appError(getUser({ companyId: companyA, id: other.id }));
    expect(error.code).toBe('not_found');
  });

  it('answers not_found for a malformed or unknown id', async () => {
    expect((await appError(getUser({ companyId: companyA, id: 'not-a-uuid' }))).code).toBe('not_found');
    expect((await appError(getUser({ companyId: companyA, id: randomUUID() }))).code).toBe('not_found');
  });
});

describe('getUserForSignIn', () => {
  it('find a user by e-mail in any case, with the hash and company name', async () => {
    const user = await newUser(companyB, 'signin');
    const found = await getUserForSignIn({ email: user.email.toUpperCase() });
    expect(found).toMatchObject({ id: user.id, companyName: 'Bravo', passwordHash: 'not-a-real-hash' });
    expect(await getUserForSignIn({ email: `nobody-${tag}@users-test.test` })).toBeNull();
  });
});

describe('updateUser', () => {
  // Which changes end the user's sessions is tested in tests/db/sessions.test.ts.
  it('changes the name', async () => {
    const user = await newUser(companyA, 'rename');
    const changed = await updateUser({ companyId: companyA, id: user.id, patch: { name: 'Renamed' } });
    expect(changed).toMatchObject({ name: 'Renamed', active: true, role: 'technician' });
  });

  it('changes the role', async () => {
    const user = await newUser(companyA, 'role');
    const changed = await updateUser({ companyId: companyA, id: user.id, patch: { role: 'lead' } });
    expect(changed).toMatchObject({ role: 'lead' });
  });

  it('deactivates and reactivates', async () => {
    const user = await newUser(companyA, 'deactivate');
    expect(await updateUser({ companyId: companyA, id: user.id, patch: { active: false } })).toMatchObject({ active: false });
    expect(await updateUser({ companyId: companyA, id: user.id, patch: { active: true } })).toMatchObject({ active: true });
  });

  it('accepts an explicit revoke alone and leaves the row as it was', async () => {
    const user = await newUser(companyA, 'revoke');
    const again = await updateUser({ companyId: companyA, id: user.id, patch: { revokeSessions: true } });
    expect(again).toEqual(user);
  });

  it("refuses to change another company's user and leaves the row as it was", async () => {
    const other = await newUser(companyB, 'update-other');
    const error = await appError(updateUser({ companyId: companyA, id: other.id, patch: { role: 'admin', active: false } }));
    expect(error.code).toBe('not_found');
    expect(await getUser({ companyId: companyB, id: other.id })).toEqual(other);
  });
});
