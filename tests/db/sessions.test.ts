// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { db } from '@/db/knex';
import { createSession, deleteOldSessions, getLiveSessionUser, revokeSession, revokeUserSessions, storedUserAgent } from '@/db/sessions';
import { createUser, updateUser } from '@/db/users';

// A company of this file's own, so the demo is neither read nor changed; deleting it at the end
// removes its users and their sessions (ON DELETE CASCADE).
const tag = randomUUID().slice(0, 8);
let companyId: string;

const newUser = (local: string) =>
  createUser({
    companyId,
    email: `${local}-${tag}@sessions-test.test`,
    name: `${local} ${tag}`,
    role: 'technician',
    passwordHash: 'not-a-real-hash',
  });

const start = (user: { id: string }, { ttlSeconds = 3600, userAgent = 'Test agent' as string | null } = {}) =>
  createSession({ userId: user.id, companyId, userAgent, ttlSeconds });

const live = async (sessionId: string) => (await getLiveSessionUser({ sessionId })) !== null;

beforeAll(async () => {
  if (!process.env.DATABASE_URL) throw new Error('DATABASE_URL is not set; run through scripts/test.mjs.');
  const [row] = await db('companies')
    .insert({ name: 'Sessions Co', office_email: `office-${tag}@sessions.test` })
    .returning('id');
  companyId = row.id;
});

afterAll(async () => {
  await db('companies').where({ id: companyId }).delete();
  await db.destroy();
});

describe('createSession', () => {
  it('stores a random id, the user and company, an expiry one ttl ahead, and no revocation', async () => {
    const user = await newUser('create');
    const a = await start(user, { ttlSeconds: 12 * 3600 });
    const b = await start(user);
    expect(a).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(b).not.toBe(a);
    const row = await db('sessions')
      .where({ id: a })
      .first('user_id', 'company_id', 'revoked_at', 'user_agent', db.raw('extract(epoch from expires_at - created_at) as ttl'));
    expect(row).toMatchObject({ user_id: user.id, company_id: companyId, revoked_at: null, user_agent: 'Test agent' });
    expect(Number(row.ttl)).toBeCloseTo(12 * 3600, 0);
  });

  it('keeps at most 300 characters of the user agent, trimmed, and null for none', async () => {
    const user = await newUser('agent');
    const long = await start(user, { userAgent: `  ${'x'.repeat(500)}` });
    const blank = await start(user, { userAgent: '   ' });
    const none = await start(user, { userAgent: null });
    const rows = await db('sessions').whereIn('id', [long, blank, none]).select('id', 'user_agent');
    const agent = (id: string) => rows.find((r) => r.id === id)?.user_agent;
    expect(agent(long)).toBe('x'.repeat(300));
    expect(agent(blank)).toBeNull();
    expect(agent(none)).toBeNull();
    // The cut never leaves half of a character made of two UTF-16 units.
    expect(storedUserAgent(`${'y'.repeat(299)}🔥`)).toBe('y'.repeat(299));
  });

  it('is refused by the database with a user agent over 300 characters, even past the module', async () => {
    const user = await newUser('check');
    await expect(
      db('sessions').insert({
        user_id: user.id,
        company_id: companyId,
        user_agent: 'z'.repeat(301),
        expires_at: db.raw("now() + interval '1 hour'"),
      }),
    ).rejects.toMatchObject({ code: '23514' });
  });
});

describe('getLiveSessionUser', () => {
  it('answers the user of a live session with the company name, in one query', async () => {
    const user = await newUser('live');
    const sid = await start(user);
    const queries: string[] = [];
    const count = (q: { sql: string }) => queries.push(q.sql);
    db.on('query', count);
    const found = await getLiveSessionUser({ sessionId: sid });
    db.off('query', count);
    expect(found).toMatchObject({
      id: user.id,
      companyId,
      email: user.email,
      role: 'technician',
      active: true,
      companyName: 'Sessions Co',
      sessionId: sid,
    });
    expect(queries).toHaveLength(1);
  });

  it('answers null for an unknown id and for a malformed one, without asking the database about the latter', async () => {
    expect(await getLiveSessionUser({ sessionId: randomUUID() })).toBeNull();
    const queries: string[] = [];
    const count = (q: { sql: string }) => queries.push(q.sql);
    db.on('query', count);
    expect(await getLiveSessionUser({ sessionId: 'not-a-uuid' })).toBeNull();
    expect(await getLiveSessionUser({ sessionId: "' or 1=1 --" })).toBeNull();
    db.off('query', count);
    expect(queries).toEqual([]);
  });

  it('does not count an expired session as live', async () => {
    const user = await newUser('expired');
    const sid = await start(user);
    await db('sessions')
      .where({ id: sid })
      .update({ expires_at: db.raw("now() - interval '1 second'") });
    expect(await live(sid)).toBe(false);
  });

  it('does not count the session of a deactivated user as live', async () => {
    const user = await newUser('inactive');
    const sid = await start(user);
    expect(await live(sid)).toBe(true);
    await db('users').where({ id: user.id }).update({ active: false });
    expect(await live(sid)).toBe(false);
  });
});

describe('revokeSession', () => {
  it('ends that session and leaves the user’s other sessions live', async () => {
    const user = await newUser('one');
    const [a, b] = [await start(user), await start(user)];
    expect(await revokeSession({ sessionId: a })).toBe(true);
    expect(await live(a)).toBe(false);
    expect(await live(b)).toBe(true);
    const row = await db('sessions').where({ id: a }).first('revoked_at');
    expect(row.revoked_at).toBeInstanceOf(Date);
  });

  it('changes nothing on a second call, an unknown id or a malformed one', async () => {
    const user = await newUser('again');
    const sid = await start(user);
    await revokeSession({ sessionId: sid });
    const first = (await db('sessions').where({ id: sid }).first('revoked_at')).revoked_at;
    expect(await revokeSession({ sessionId: sid })).toBe(false);
    expect((await db('sessions').where({ id: sid }).first('revoked_at')).revoked_at).toEqual(first);
    expect(await revokeSession({ sessionId: randomUUID() })).toBe(false);
    expect(await revokeSession({ sessionId: 'nope' })).toBe(false);
  });
});

describe('revokeUserSessions', () => {
  it('ends every session of the user and only theirs; a session begun afterwards is live', async () => {
    const user = await newUser('all');
    const other = await newUser('other');
    const mine = [await start(user), await start(user), await start(user)];
    const theirs = await start(other);
    expect(await revokeUserSessions({ userId: user.id })).toBe(3);
    for (const sid of mine) expect(await live(sid)).toBe(false);
    expect(await live(theirs)).toBe(true);
    expect(await live(await start(user))).toBe(true);
  });
});

describe('updateUser ends the sessions', () => {
  it('on a role change, a deactivation and an explicit revoke, but not on a rename', async () => {
    const user = await newUser('admin-change');
    const renamed = await start(user);
    await updateUser({ companyId, id: user.id, patch: { name: 'Renamed' } });
    expect(await live(renamed)).toBe(true);

    await updateUser({ companyId, id: user.id, patch: { role: 'lead' } });
    expect(await live(renamed)).toBe(false);

    const beforeRevoke = await start(user);
    await updateUser({ companyId, id: user.id, patch: { revokeSessions: true } });
    expect(await live(beforeRevoke)).toBe(false);

    const beforeDeactivation = await start(user);
    await updateUser({ companyId, id: user.id, patch: { active: false } });
    await updateUser({ companyId, id: user.id, patch: { active: true } });
    // Reactivated, the person must sign in again: the old row stays ended.
    expect(await live(beforeDeactivation)).toBe(false);
  });

  it('ends nothing when the change itself is refused', async () => {
    const user = await newUser('refused');
    const sid = await start(user);
    const [elsewhere] = await db('companies')
      .insert({ name: 'Elsewhere Co', office_email: `elsewhere-${tag}@sessions.test` })
      .returning('id');
    try {
      await expect(updateUser({ companyId: elsewhere.id, id: user.id, patch: { active: false } })).rejects.toMatchObject({
        code: 'not_found',
      });
      expect(await live(sid)).toBe(true);
    } finally {
      await db('companies').where({ id: elsewhere.id }).delete();
    }
  });

  it('rolls the revocation back with the change when the transaction fails', async () => {
    const user = await newUser('rollback');
    const sid = await start(user);
    await expect(
      db.transaction(async (trx) => {
        await updateUser({ companyId, id: user.id, patch: { role: 'lead' } }, trx);
        throw new Error('fail after the change');
      }),
    ).rejects.toThrow('fail after the change');
    expect(await live(sid)).toBe(true);
    expect((await db('users').where({ id: user.id }).first('role')).role).toBe('technician');
  });
});

describe('deleteOldSessions', () => {
  it('deletes rows expired over a day ago and keeps the recent and live ones', async () => {
    const user = await newUser('old');
    const [old, recent, current] = [await start(user), await start(user), await start(user)];
    await db('sessions')
      .where({ id: old })
      .update({ created_at: db.raw("now() - interval '3 days'"), expires_at: db.raw("now() - interval '2 days'") });
    await db('sessions')
      .where({ id: recent })
      .update({ expires_at: db.raw("now() - interval '1 hour'") });
    expect(await deleteOldSessions()).toBeGreaterThanOrEqual(1);
    const left = (await db('sessions').whereIn('id', [old, recent, current]).pluck('id')).sort();
    expect(left).toEqual([recent, current].sort());
  });
});
