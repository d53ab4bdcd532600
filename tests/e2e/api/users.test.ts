import { randomUUID } from 'node:crypto';
import { ApiClient, DEMO, SIGN_IN_REFUSED, signedIn, unique } from '@/tests/e2e/support/http';

interface AdminUser {
  id: string;
  email: string;
  name: string;
  role: string;
  active: boolean;
  createdAt: string;
}

const NON_ADMINS = [DEMO.apprentice, DEMO.technician, DEMO.lead, DEMO.trainer] as const;
const PASSWORD = 'starting-password-1';

let admin: ApiClient;
let otherAdmin: ApiClient;

async function create(role = 'technician', label = 'user'): Promise<AdminUser> {
  const email = `${unique(label)}@api-test.test`;
  const res = await admin.post('/api/users', { email, name: `Test ${label}`, role, password: PASSWORD });
  if (res.status !== 201) throw new Error(`creating ${email} answered ${res.status}: ${res.text}`);
  return res.json;
}

async function reread(id: string, as: ApiClient = admin): Promise<AdminUser | undefined> {
  const res = await as.get('/api/users');
  expect(res.status).toBe(200);
  return (res.json as AdminUser[]).find((u) => u.id === id);
}

beforeAll(async () => {
  admin = await signedIn(DEMO.admin);
  otherAdmin = await signedIn(DEMO.otherAdmin);
});

describe('who may use /api/users', () => {
  it('answers 401 to every method without a session', async () => {
    const anon = new ApiClient();
    const target = await create();
    const get = await anon.get('/api/users');
    const post = await anon.post('/api/users', { email: `${unique('anon')}@api-test.test`, name: 'X', role: 'admin', password: PASSWORD });
    const patch = await anon.patch(`/api/users/${target.id}`, { role: 'admin' });
    for (const res of [get, post, patch]) {
      expect(res.status).toBe(401);
      expect(res.json.error.code).toBe('unauthorized');
    }
    expect((await reread(target.id))?.role).toBe('technician');
  });

  it.each(NON_ADMINS)('answers 403 to %s for GET, POST and PATCH, and changes nothing', async (email) => {
    const client = await signedIn(email);
    const target = await create();
    const newEmail = `${unique('by-non-admin')}@api-test.test`;

    const get = await client.get('/api/users');
    const post = await client.post('/api/users', { email: newEmail, name: 'Sneaky', role: 'admin', password: PASSWORD });
    const patch = await client.patch(`/api/users/${target.id}`, { role: 'admin' });
    const selfPatch = await client.patch(`/api/users/${(await client.get('/api/me')).json.id}`, { role: 'admin' });
    for (const res of [get, post, patch, selfPatch]) {
      expect(res.status).toBe(403);
      expect(res.json.error).toMatchObject({ code: 'forbidden', message: 'Your role does not allow this.' });
    }
    expect(get.json).not.toBeInstanceOf(Array);

    const list: AdminUser[] = (await admin.get('/api/users')).json;
    expect(list.find((u) => u.email === newEmail)).toBeUndefined();
    expect(list.find((u) => u.id === target.id)?.role).toBe('technician');
    expect((await client.get('/api/me')).json.role).not.toBe('admin');
  });

  it("lets the admin list the company's users, without password hashes", async () => {
    const res = await admin.get('/api/users');
    expect(res.status).toBe(200);
    const users = res.json as AdminUser[];
    const emails = users.map((u) => u.email);
    for (const email of [DEMO.apprentice, DEMO.technician, DEMO.lead, DEMO.lead2, DEMO.trainer, DEMO.admin])
      expect(emails).toContain(email);
    expect(emails).not.toContain(DEMO.otherAdmin);
    expect(emails).not.toContain(DEMO.otherTechnician);
    for (const user of users) {
      expect(Object.keys(user).sort()).toEqual(['active', 'createdAt', 'email', 'id', 'name', 'role']);
    }
    expect(res.text).not.toMatch(/argon2|password/i);
  });
});

describe('POST /api/users', () => {
  it('creates a user (201) who can then sign in with the starting password', async () => {
    const email = `${unique('New.Person')}@API-Test.test`;
    const res = await admin.post('/api/users', { email, name: '  Ines Marlow ', role: 'apprentice', password: PASSWORD });
    expect(res.status).toBe(201);
    expect(res.json).toMatchObject({ email: email.toLowerCase(), name: 'Ines Marlow', role: 'apprentice', active: true });
    expect(res.json).not.toHaveProperty('passwordHash');

    const person = new ApiClient();
    const signIn = await person.signIn(email, PASSWORD);
    expect(signIn.status).toBe(200);
    expect(signIn.json).toMatchObject({ id: res.json.id, role: 'apprentice', company: { name: 'Kestrel Valley Heating Co.' } });
    expect((await person.get('/api/users')).status).toBe(403);
  });

  it('puts the user in the admin’s own company whatever the body says', async () => {
    const otherCompany = (await otherAdmin.get('/api/me')).json.company.id as string;
    const email = `${unique('smuggled')}@api-test.test`;
    const res = await admin.post('/api/users', {
      email,
      name: 'Smuggled',
      role: 'technician',
      password: PASSWORD,
      companyId: otherCompany,
    });
    expect(res.status).toBe(201);
    expect((await otherAdmin.get('/api/users')).json.map((u: AdminUser) => u.email)).not.toContain(email);
    expect((await reread(res.json.id))?.email).toBe(email);
  });

  it('answers 409 to an e-mail that exists, in any case and in any company', async () => {
    const existing = await create();
    for (const email of [existing.email, existing.email.toUpperCase(), DEMO.otherTechnician]) {
      const res = await admin.post('/api/users', { email, name: 'Twin', role: 'technician', password: PASSWORD });
      expect(res.status, email).toBe(409);
      expect(res.json.error).toMatchObject({
        code: 'conflict',
        fieldErrors: { email: ['A user with that e-mail address already exists.'] },
      });
    }
    const twins = ((await admin.get('/api/users')).json as AdminUser[]).filter((u) => u.email === existing.email);
    expect(twins).toHaveLength(1);
  });

  it('answers 400 with field errors to a bad role, short password or bad e-mail, and creates nobody', async () => {
    const email = `${unique('refused')}@api-test.test`;
    const badRole = await admin.post('/api/users', { email, name: 'R', role: 'owner', password: PASSWORD });
    expect(badRole.status).toBe(400);
    expect(badRole.json.error.code).toBe('bad_request');
    expect(badRole.json.error.fieldErrors.role).toEqual(['Role must be one of: apprentice, technician, lead, trainer, admin.']);

    const shortPassword = await admin.post('/api/users', { email, name: 'R', role: 'lead', password: 'short' });
    expect(shortPassword.status).toBe(400);
    expect(shortPassword.json.error.fieldErrors.password).toEqual(['Use at least 12 characters.']);

    const badEmail = await admin.post('/api/users', { email: 'nope', name: 'R', role: 'lead', password: PASSWORD });
    expect(badEmail.status).toBe(400);
    expect(badEmail.json.error.fieldErrors.email).toEqual(['Enter a valid e-mail address.']);

    const notJson = await admin.post('/api/users', undefined, { raw: 'email=x' });
    expect(notJson.status).toBe(400);
    expect(notJson.json.error.message).toBe('The request body must be JSON.');

    const emails = ((await admin.get('/api/users')).json as AdminUser[]).map((u) => u.email);
    expect(emails).not.toContain(email);
  });
});

describe('PATCH /api/users/{id}', () => {
  it('changes a role, and the person’s open session ends at once', async () => {
    const user = await create('technician', 'promoted');
    const session = await signedIn(user.email, PASSWORD);
    expect((await session.get('/api/me')).status).toBe(200);

    const res = await admin.patch(`/api/users/${user.id}`, { role: 'lead' });
    expect(res.status).toBe(200);
    expect(res.json).toMatchObject({ id: user.id, role: 'lead', active: true });
    expect((await reread(user.id))?.role).toBe('lead');
    expect((await session.get('/api/me')).status).toBe(401);

    const again = await signedIn(user.email, PASSWORD);
    expect((await again.get('/api/me')).json.role).toBe('lead');
  });

  it('renames without ending the session', async () => {
    const user = await create('technician', 'renamed');
    const session = await signedIn(user.email, PASSWORD);
    const res = await admin.patch(`/api/users/${user.id}`, { name: 'Renamed Person' });
    expect(res.status).toBe(200);
    expect((await reread(user.id))?.name).toBe('Renamed Person');
    const me = await session.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.json.name).toBe('Renamed Person');
  });

  it('deactivates: every open session answers 401 at once, and sign-in is refused', async () => {
    const user = await create('technician', 'deactivated');
    const phone = await signedIn(user.email, PASSWORD);
    const tablet = await signedIn(user.email, PASSWORD);
    const res = await admin.patch(`/api/users/${user.id}`, { active: false });
    expect(res.status).toBe(200);
    expect(res.json.active).toBe(false);
    expect((await phone.get('/api/me')).status).toBe(401);
    expect((await tablet.get('/api/company')).status).toBe(401);
    const signIn = await new ApiClient().signIn(user.email, PASSWORD);
    expect(signIn.status).toBe(401);
    expect(signIn.json.error.message).toBe(SIGN_IN_REFUSED);

    // Reactivated, the person signs in again; the old sessions stay ended.
    expect((await admin.patch(`/api/users/${user.id}`, { active: true })).json.active).toBe(true);
    expect((await new ApiClient().signIn(user.email, PASSWORD)).status).toBe(200);
    expect((await phone.get('/api/me')).status).toBe(401);
  });

  it('revokes sessions: the open session answers 401, a new sign-in works', async () => {
    const user = await create('apprentice', 'revoked');
    const session = await signedIn(user.email, PASSWORD);
    const res = await admin.patch(`/api/users/${user.id}`, { revokeSessions: true });
    expect(res.status).toBe(200);
    expect(res.json).toMatchObject({ active: true, role: 'apprentice' });
    expect((await session.get('/api/me')).status).toBe(401);
    expect((await signedIn(user.email, PASSWORD).then((c) => c.get('/api/me'))).status).toBe(200);
  });

  it('refuses to let the admin deactivate or demote themselves (400), and changes nothing', async () => {
    const me = (await admin.get('/api/me')).json;
    const deactivate = await admin.patch(`/api/users/${me.id}`, { active: false });
    expect(deactivate.status).toBe(400);
    expect(deactivate.json.error.message).toMatch(/cannot deactivate yourself/);
    const demote = await admin.patch(`/api/users/${me.id}`, { role: 'technician' });
    expect(demote.status).toBe(400);
    const self = await reread(me.id);
    expect(self).toMatchObject({ active: true, role: 'admin' });
    // The admin's own session survived both attempts.
    expect((await admin.get('/api/me')).status).toBe(200);
  });

  it('answers 400 to bad input and leaves the user and their session as they were', async () => {
    const user = await create('technician', 'untouched');
    const session = await signedIn(user.email, PASSWORD);
    const before = await reread(user.id);
    const attempts: [unknown, string?][] = [
      [{}],
      [{ role: 'boss' }, 'role'],
      [{ active: 'no' }, 'active'],
      [{ revokeSessions: false }, 'revokeSessions'],
      [{ name: '' }, 'name'],
      [{ email: 'changed@api-test.test' }],
      [{ role: 'lead', companyId: randomUUID() }],
      [[{ role: 'lead' }]],
    ];
    for (const [body, field] of attempts) {
      const res = await admin.patch(`/api/users/${user.id}`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.json.error.code).toBe('bad_request');
      if (field) expect(res.json.error.fieldErrors[field], JSON.stringify(body)).toHaveLength(1);
      expect(await reread(user.id)).toEqual(before);
    }
    const notJson = await admin.patch(`/api/users/${user.id}`, undefined, { raw: 'role=lead' });
    expect(notJson.status).toBe(400);
    expect(await reread(user.id)).toEqual(before);
    // No refused request bumped the session version.
    expect((await session.get('/api/me')).status).toBe(200);
  });

  it('answers 404 to a malformed or unknown id', async () => {
    for (const id of ['not-a-uuid', '123', randomUUID()]) {
      const res = await admin.patch(`/api/users/${id}`, { role: 'lead' });
      expect(res.status, id).toBe(404);
      expect(res.json.error).toMatchObject({ code: 'not_found', message: 'That user was not found.' });
    }
  });
});

describe('isolation between companies', () => {
  it("shows the other company's admin none of our users", async () => {
    const ours = ((await admin.get('/api/users')).json as AdminUser[]).map((u) => u.id);
    const res = await otherAdmin.get('/api/users');
    expect(res.status).toBe(200);
    const theirs = res.json as AdminUser[];
    expect(theirs.map((u) => u.email)).toEqual(expect.arrayContaining([DEMO.otherAdmin, DEMO.otherTechnician]));
    expect(theirs.filter((u) => ours.includes(u.id))).toEqual([]);
    expect(theirs.filter((u) => u.email.endsWith('@demo.test') && !u.email.endsWith('@other.demo.test'))).toEqual([]);
  });

  it("answers 404 (not 403) when the other company's admin changes one of our users, and changes nothing", async () => {
    const user = await create('technician', 'isolated');
    const session = await signedIn(user.email, PASSWORD);
    for (const patch of [{ role: 'admin' }, { active: false }, { revokeSessions: true }, { name: 'Taken Over' }]) {
      const res = await otherAdmin.patch(`/api/users/${user.id}`, patch);
      expect(res.status, JSON.stringify(patch)).toBe(404);
      expect(res.json.error.code).toBe('not_found');
    }
    expect(await reread(user.id)).toEqual(user);
    expect((await session.get('/api/me')).status).toBe(200);
  });

  it("answers 404 when our admin changes the other company's user", async () => {
    const theirs = ((await otherAdmin.get('/api/users')).json as AdminUser[]).find((u) => u.email === DEMO.otherTechnician)!;
    const res = await admin.patch(`/api/users/${theirs.id}`, { active: false });
    expect(res.status).toBe(404);
    expect(await reread(theirs.id, otherAdmin)).toEqual(theirs);
  });
});

describe('/api/company', () => {
  const ROLES_OF_KESTREL = [DEMO.apprentice, DEMO.technician, DEMO.lead, DEMO.trainer, DEMO.admin];

  it('answers 401 without a session', async () => {
    expect((await new ApiClient().get('/api/company')).status).toBe(401);
    expect((await new ApiClient().patch('/api/company', { name: 'X', officeEmail: 'x@x.test', displayUnits: 'us' })).status).toBe(401);
  });

  it("gives every signed-in role its own company's settings", async () => {
    for (const email of ROLES_OF_KESTREL) {
      const res = await (await signedIn(email)).get('/api/company');
      expect(res.status, email).toBe(200);
      expect(res.json).toMatchObject({ name: 'Kestrel Valley Heating Co.', displayUnits: 'us' });
    }
    expect((await otherAdmin.get('/api/company')).json).toMatchObject({ name: 'Ironbark Comfort Services', displayUnits: 'metric' });
  });

  it.each(NON_ADMINS)('answers 403 to a PATCH by %s and changes nothing', async (email) => {
    const before = (await admin.get('/api/company')).json;
    const res = await (await signedIn(email)).patch('/api/company', { name: 'Hijacked', officeEmail: 'x@x.test', displayUnits: 'metric' });
    expect(res.status).toBe(403);
    expect((await admin.get('/api/company')).json).toEqual(before);
  });

  it('lets the admin change the settings, for their company only', async () => {
    const before = (await admin.get('/api/company')).json;
    const theirsBefore = (await otherAdmin.get('/api/company')).json;
    try {
      const res = await admin.patch('/api/company', {
        name: 'Kestrel Valley Heating',
        officeEmail: 'Desk@Kestrel.TEST',
        displayUnits: 'metric',
      });
      expect(res.status).toBe(200);
      // The time zone is left out of the change, so it stays as it was.
      expect(res.json).toEqual({
        id: before.id,
        name: 'Kestrel Valley Heating',
        officeEmail: 'desk@kestrel.test',
        displayUnits: 'metric',
        timeZone: before.timeZone,
      });
      expect((await admin.get('/api/company')).json).toEqual(res.json);
      expect((await otherAdmin.get('/api/company')).json).toEqual(theirsBefore);
    } finally {
      const restore = await admin.patch('/api/company', {
        name: before.name,
        officeEmail: before.officeEmail,
        displayUnits: before.displayUnits,
      });
      expect(restore.status).toBe(200);
    }
  });

  it('answers 400 with field errors to an invalid e-mail or units, and changes nothing', async () => {
    const before = (await admin.get('/api/company')).json;
    const badEmail = await admin.patch('/api/company', { name: before.name, officeEmail: 'not-an-email', displayUnits: 'us' });
    expect(badEmail.status).toBe(400);
    expect(badEmail.json.error.fieldErrors.officeEmail).toEqual(['Enter a valid e-mail address.']);
    const badUnits = await admin.patch('/api/company', { name: 'Other', officeEmail: 'a@b.test', displayUnits: 'imperial' });
    expect(badUnits.status).toBe(400);
    expect(badUnits.json.error.fieldErrors.displayUnits).toEqual(['Choose US customary or metric.']);
    const partial = await admin.patch('/api/company', { name: 'Only a name' });
    expect(partial.status).toBe(400);
    const notJson = await admin.patch('/api/company', undefined, { raw: '' });
    expect(notJson.status).toBe(400);
    expect((await admin.get('/api/company')).json).toEqual(before);
  });
});
