// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { db } from '@/db/knex';
import { createSession, getLiveSessionUser, revokeSession, revokeUserSessions } from '@/db/sessions';
import { createUser, updateUser } from '@/db/users';

// A company of this file's own, so the demo is neither read nor changed.
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

const start = (user: { id: string; sessionVersion: number }, ttlSeconds = 3600) =>
  createSession({ userId: user.id, companyId, userVersion: user.sessionVersion, userAgent: 'x'.repeat(500), ttlSeconds });

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

describe('sessions', () => {
  it('finds the user of a live session with the company name, and nothing for an unknown or malformed id', async () => {
    const user = await newUser('live');
    const sid = await start(user);
    expect(await getLiveSessionUser({ sessionId: sid })).toMatchObject({ id: user.id, companyName: 'Sessions Co', sessionId: sid });
    expect(await getLiveSessionUser({ sessionId: randomUUID() })).toBeNull();
    expect(await getLiveSessionUser({ sessionId: 'not-a-uuid' })).toBeNull();
    const row = await db('sessions').where({ id: sid }).first('user_agent');
    expect(row.user_agent).toHaveLength(300);
  });

  it('ends one session on revoke and leaves the user’s other sessions live', async () => {
    const user = await newUser('one');
    const [a, b] = [await start(user), await start(user)];
    await revokeSession({ sessionId: a });
    expect(await getLiveSessionUser({ sessionId: a })).toBeNull();
    expect(await getLiveSessionUser({ sessionId: b })).not.toBeNull();
  });

  it('ends every session of the user, and only theirs, when signed out everywhere', async () => {
    const user = await newUser('all');
    const other = await newUser('other');
    const mine = [await start(user), await start(user)];
    const theirs = await start(other);
    await revokeUserSessions({ userId: user.id });
    for (const sid of mine) expect(await getLiveSessionUser({ sessionId: sid })).toBeNull();
    expect(await getLiveSessionUser({ sessionId: theirs })).not.toBeNull();
    // A session begun after it is live again.
    const fresh = await db('users').where({ id: user.id }).first('session_version');
    expect(await getLiveSessionUser({ sessionId: await start({ id: user.id, sessionVersion: fresh.session_version }) })).not.toBeNull();
  });

  it('treats an expired session, a deactivated user and a role change as ended', async () => {
    const user = await newUser('ends');
    const expired = await start(user, 1);
    await db('sessions')
      .where({ id: expired })
      .update({ expires_at: new Date(Date.now() - 1000) });
    expect(await getLiveSessionUser({ sessionId: expired })).toBeNull();

    const sid = await start(user);
    await updateUser({ companyId, id: user.id, patch: { role: 'lead' } });
    expect(await getLiveSessionUser({ sessionId: sid })).toBeNull();

    const again = await db('users').where({ id: user.id }).first('session_version');
    const sid2 = await start({ id: user.id, sessionVersion: again.session_version });
    await db('users').where({ id: user.id }).update({ active: false });
    expect(await getLiveSessionUser({ sessionId: sid2 })).toBeNull();
  });
});
