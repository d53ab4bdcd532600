// Sessions that end, over HTTP against the built app: a copied cookie (ApiClient.clone) stands for a
// stolen one, and each check looks at what it can still do after the session ended.
// @vitest-environment node
import knexFactory, { type Knex } from 'knex';
import { ApiClient, DEMO, SIGN_IN_REFUSED, signedIn, unique } from '@/tests/e2e/support/http';

const PASSWORD = 'sessions-password-1';

let db: Knex;
let admin: ApiClient;

/** A user of the demo company made for one test, so that ending their sessions touches no one else. */
async function newUser(label: string, role = 'technician') {
  const email = `${unique(label)}@sessions-e2e.test`;
  const res = await admin.post('/api/users', { email, name: `Sessions ${label}`, role, password: PASSWORD });
  if (res.status !== 201) throw new Error(`creating ${email} answered ${res.status}: ${res.text}`);
  return { id: res.json.id as string, email };
}

const openRows = (userId: string) =>
  db('sessions').where({ user_id: userId }).whereNull('revoked_at').count<{ count: string }[]>('* as count');
const openCount = async (userId: string) => Number((await openRows(userId))[0].count);

beforeAll(async () => {
  if (!process.env.DATABASE_URL) throw new Error('DATABASE_URL is not set; run through scripts/test.mjs.');
  db = knexFactory({ client: 'pg', connection: process.env.DATABASE_URL, pool: { min: 0, max: 2 } });
  admin = await signedIn(DEMO.admin);
});

afterAll(async () => {
  await db?.destroy();
});

describe('POST /api/auth/sign-out', () => {
  it('ends the session on the server: a copied cookie gets 401 and cannot create a site', async () => {
    const user = await newUser('copied');
    const tech = await signedIn(user.email, PASSWORD);
    const copy = tech.clone();
    expect((await copy.get('/api/me')).status).toBe(200);

    const out = await tech.post('/api/auth/sign-out');
    expect(out.status).toBe(204);
    expect(tech.hasCookie('pg_session')).toBe(false);

    const me = await copy.get('/api/me');
    expect(me.status).toBe(401);
    expect(me.json.error.code).toBe('unauthorized');
    const name = unique('Site after sign-out');
    const made = await copy.post('/api/sites', { name, address: '1 Ended Session Rd' });
    expect(made.status).toBe(401);
    expect(await db('sites').where({ name }).first()).toBeUndefined();
    expect(await openCount(user.id)).toBe(0);
  });

  it('answers 204 without a session, and with a session that already ended', async () => {
    expect((await new ApiClient().post('/api/auth/sign-out')).status).toBe(204);
    const user = await newUser('twice');
    const client = await signedIn(user.email, PASSWORD);
    const copy = client.clone();
    expect((await client.post('/api/auth/sign-out')).status).toBe(204);
    expect((await copy.post('/api/auth/sign-out')).status).toBe(204);
    expect((await copy.get('/api/me')).status).toBe(401);
  });

  it('ends only its own session: the same user on another device stays signed in', async () => {
    const user = await newUser('one-device');
    const phone = await signedIn(user.email, PASSWORD);
    const tablet = await signedIn(user.email, PASSWORD);
    expect(await openCount(user.id)).toBe(2);
    expect((await phone.post('/api/auth/sign-out')).status).toBe(204);
    expect((await phone.get('/api/me')).status).toBe(401);
    expect((await tablet.get('/api/me')).status).toBe(200);
    expect(await openCount(user.id)).toBe(1);
  });
});

describe('POST /api/auth/sign-in', () => {
  it('stores one session row per sign-in with the user agent, and ends the session it replaces', async () => {
    const user = await newUser('row');
    const client = new ApiClient();
    const agent = `Sessions e2e ${'z'.repeat(400)}`;
    const first = await client.call(
      'POST',
      '/api/auth/sign-in',
      { email: user.email, password: PASSWORD },
      { headers: { 'user-agent': agent } },
    );
    expect(first.status).toBe(200);
    const rows = await db('sessions')
      .where({ user_id: user.id })
      .select('user_agent', 'revoked_at', db.raw('extract(epoch from expires_at - created_at) as ttl'));
    expect(rows).toHaveLength(1);
    expect(rows[0].user_agent).toBe(agent.slice(0, 300));
    expect(rows[0].revoked_at).toBeNull();
    // The cookie and the row last the same 12 hours (lib/server/session.ts).
    expect(Number(rows[0].ttl)).toBeCloseTo(12 * 3600, 0);

    const before = client.clone();
    expect((await client.signIn(user.email, PASSWORD)).status).toBe(200);
    expect((await before.get('/api/me')).status).toBe(401);
    expect((await client.get('/api/me')).status).toBe(200);
    expect(await openCount(user.id)).toBe(1);
  });
});

describe('POST /api/auth/sign-out-everywhere', () => {
  it('answers 401 without a session', async () => {
    const res = await new ApiClient().post('/api/auth/sign-out-everywhere');
    expect(res.status).toBe(401);
    expect(res.json.error.code).toBe('unauthorized');
  });

  it('ends every session of the user, copies included, and not another user’s', async () => {
    const user = await newUser('everywhere');
    const bystander = await newUser('bystander');
    const phone = await signedIn(user.email, PASSWORD);
    const tablet = await signedIn(user.email, PASSWORD);
    const stolen = tablet.clone();
    const other = await signedIn(bystander.email, PASSWORD);

    const res = await phone.post('/api/auth/sign-out-everywhere');
    expect(res.status).toBe(204);
    expect(res.text).toBe('');
    expect(phone.hasCookie('pg_session')).toBe(false);
    for (const client of [phone, tablet, stolen]) expect((await client.get('/api/me')).status).toBe(401);
    const name = unique('Site after everywhere');
    expect((await stolen.post('/api/sites', { name, address: '2 Ended Session Rd' })).status).toBe(401);
    expect(await db('sites').where({ name }).first()).toBeUndefined();
    expect(await openCount(user.id)).toBe(0);

    expect((await other.get('/api/me')).status).toBe(200);
    expect((await admin.get('/api/me')).status).toBe(200);

    // Signing in again works, and only the new session is live.
    const again = await signedIn(user.email, PASSWORD);
    expect((await again.get('/api/me')).json.email).toBe(user.email);
    expect((await tablet.get('/api/me')).status).toBe(401);
  });
});

describe("an admin's change ends the user's sessions", () => {
  it('deactivation ends them all; reactivated, the person signs in again and the old ones stay ended', async () => {
    const user = await newUser('deactivated');
    const phone = await signedIn(user.email, PASSWORD);
    const copy = phone.clone();
    expect((await admin.patch(`/api/users/${user.id}`, { active: false })).status).toBe(200);
    expect((await phone.get('/api/me')).status).toBe(401);
    expect((await copy.get('/api/company')).status).toBe(401);
    expect(await openCount(user.id)).toBe(0);
    const refused = await new ApiClient().signIn(user.email, PASSWORD);
    expect(refused.status).toBe(401);
    expect(refused.json.error.message).toBe(SIGN_IN_REFUSED);

    expect((await admin.patch(`/api/users/${user.id}`, { active: true })).status).toBe(200);
    expect((await phone.get('/api/me')).status).toBe(401);
    expect((await (await signedIn(user.email, PASSWORD)).get('/api/me')).status).toBe(200);
  });

  it('a role change ends them; the next sign-in carries the new role', async () => {
    const user = await newUser('promoted');
    const session = await signedIn(user.email, PASSWORD);
    expect((await session.get('/api/me')).json.role).toBe('technician');
    expect((await admin.patch(`/api/users/${user.id}`, { role: 'lead' })).status).toBe(200);
    expect((await session.get('/api/me')).status).toBe(401);
    expect((await (await signedIn(user.email, PASSWORD)).get('/api/me')).json.role).toBe('lead');
  });

  it('revokeSessions ends them and changes nothing else; a rename ends none', async () => {
    const user = await newUser('revoked');
    const a = await signedIn(user.email, PASSWORD);
    const b = await signedIn(user.email, PASSWORD);
    expect((await admin.patch(`/api/users/${user.id}`, { name: 'Sessions renamed' })).status).toBe(200);
    expect((await a.get('/api/me')).json.name).toBe('Sessions renamed');

    const res = await admin.patch(`/api/users/${user.id}`, { revokeSessions: true });
    expect(res.status).toBe(200);
    expect(res.json).toMatchObject({ id: user.id, role: 'technician', active: true, name: 'Sessions renamed' });
    expect((await a.get('/api/me')).status).toBe(401);
    expect((await b.get('/api/me')).status).toBe(401);
    expect((await (await signedIn(user.email, PASSWORD)).get('/api/me')).status).toBe(200);
  });

  it("a refused change (another company's admin) ends nothing", async () => {
    const user = await newUser('untouched');
    const session = await signedIn(user.email, PASSWORD);
    const otherAdmin = await signedIn(DEMO.otherAdmin);
    const res = await otherAdmin.patch(`/api/users/${user.id}`, { active: false });
    expect(res.status).toBe(404);
    expect((await session.get('/api/me')).status).toBe(200);
    expect(await openCount(user.id)).toBe(1);
  });
});
