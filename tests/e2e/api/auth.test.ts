import { ApiClient, DEMO, DEMO_PASSWORD, SIGN_IN_REFUSED, signedIn, unique } from '@/tests/e2e/support/http';

const SIGN_IN = '/api/auth/sign-in';

async function createUser(admin: ApiClient, label: string, password = 'a-long-password-1') {
  const email = `${unique(label)}@demo.test`;
  const res = await admin.post('/api/users', { email, name: `Test ${label}`, role: 'technician', password });
  if (res.status !== 201) throw new Error(`creating ${email} answered ${res.status}: ${res.text}`);
  return { ...(res.json as { id: string; email: string }), password };
}

describe('POST /api/auth/sign-in', () => {
  it('signs in and sets an httpOnly, SameSite=Lax session cookie', async () => {
    const client = new ApiClient();
    const res = await client.signIn(DEMO.lead);
    expect(res.status).toBe(200);
    expect(res.json).toEqual({
      id: expect.stringMatching(/^[0-9a-f-]{36}$/),
      email: DEMO.lead,
      name: 'Marguerite Sandoval',
      role: 'lead',
      company: { id: expect.stringMatching(/^[0-9a-f-]{36}$/), name: 'Kestrel Valley Heating Co.' },
    });
    expect(res.json).not.toHaveProperty('passwordHash');
    const cookie = res.setCookies.find((c) => c.startsWith('pg_session='));
    expect(cookie).toBeDefined();
    expect(cookie).toMatch(/;\s*HttpOnly/i);
    expect(cookie).toMatch(/;\s*SameSite=Lax/i);
    expect(cookie).toMatch(/;\s*Path=\//i);
    // Served over plain http on loopback here, so a Secure cookie would never come back.
    expect(cookie).not.toMatch(/;\s*Secure/i);
  });

  it('accepts the e-mail in any case and with spaces around it', async () => {
    const res = await new ApiClient().signIn('  TECHNICIAN@Demo.Test ');
    expect(res.status).toBe(200);
    expect(res.json.email).toBe(DEMO.technician);
  });

  it('answers 401 with the same message for a wrong password and an unknown e-mail', async () => {
    const wrong = await new ApiClient().signIn(DEMO.trainer, 'not-the-password');
    const unknown = await new ApiClient().signIn(`${unique('nobody')}@demo.test`, DEMO_PASSWORD);
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.json).toEqual({ error: { code: 'unauthorized', message: SIGN_IN_REFUSED } });
    expect(unknown.json).toEqual(wrong.json);
    expect(wrong.setCookies.filter((c) => c.startsWith('pg_session=') && !/max-age=0/i.test(c))).toEqual([]);
  });

  it('answers 400 to a body that is not JSON', async () => {
    const res = await new ApiClient().post(SIGN_IN, undefined, { raw: '{"email": "lead@demo.test", ' });
    expect(res.status).toBe(400);
    expect(res.json.error).toMatchObject({ code: 'bad_request', message: 'The request body must be JSON.' });
  });

  it('answers 400 with field errors to missing or malformed fields', async () => {
    const empty = await new ApiClient().post(SIGN_IN, {});
    expect(empty.status).toBe(400);
    expect(empty.json.error.code).toBe('bad_request');
    expect(Object.keys(empty.json.error.fieldErrors).sort()).toEqual(['email', 'password']);

    const badEmail = await new ApiClient().post(SIGN_IN, { email: 'lead-at-demo', password: 'x' });
    expect(badEmail.status).toBe(400);
    expect(badEmail.json.error.fieldErrors.email).toEqual(['Enter a valid e-mail address.']);
    expect(badEmail.json.error.message).toMatch(/Enter a valid e-mail address/);

    const array = await new ApiClient().post(SIGN_IN, [DEMO.lead, DEMO_PASSWORD]);
    expect(array.status).toBe(400);
  });

  it('refuses a deactivated account with the same message, even with the right password', async () => {
    const admin = await signedIn(DEMO.admin);
    const user = await createUser(admin, 'deactivated');
    expect((await admin.patch(`/api/users/${user.id}`, { active: false })).status).toBe(200);
    const res = await new ApiClient().signIn(user.email, user.password);
    expect(res.status).toBe(401);
    expect(res.json.error.message).toBe(SIGN_IN_REFUSED);
  });
});

describe('sign-in rate limit', () => {
  it('answers 429 with Retry-After after 5 failures for one e-mail, from any address', async () => {
    const email = `${unique('limited')}@demo.test`;
    for (let i = 0; i < 5; i++) {
      // A new client address each time: the per-e-mail limit must not depend on where they come from.
      const res = await new ApiClient().signIn(email, `wrong-${i}`);
      expect(res.status, `failure ${i + 1}`).toBe(401);
    }
    const res = await new ApiClient().signIn(email, 'wrong-again');
    expect(res.status).toBe(429);
    expect(res.json.error.code).toBe('rate_limited');
    expect(res.json.error.message).toMatch(/Too many failed sign-ins/);
    const retryAfter = Number(res.headers.get('retry-after'));
    expect(Number.isInteger(retryAfter)).toBe(true);
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(15 * 60);
    // The same address in another case is the same account.
    expect((await new ApiClient().signIn(email.toUpperCase(), 'x')).status).toBe(429);
  });

  it('blocks even the right password once the e-mail is limited', async () => {
    const admin = await signedIn(DEMO.admin);
    const user = await createUser(admin, 'blocked');
    for (let i = 0; i < 5; i++) expect((await new ApiClient().signIn(user.email, 'wrong-password')).status).toBe(401);
    const res = await new ApiClient().signIn(user.email, user.password);
    expect(res.status).toBe(429);
    expect(res.headers.get('retry-after')).toMatch(/^\d+$/);
    expect(res.setCookies.some((c) => c.startsWith('pg_session=') && !/max-age=0/i.test(c))).toBe(false);
  });

  it('does not count a successful sign-in', async () => {
    const admin = await signedIn(DEMO.admin);
    const user = await createUser(admin, 'counted');
    for (let i = 0; i < 4; i++) expect((await new ApiClient().signIn(user.email, 'wrong-password')).status).toBe(401);
    expect((await new ApiClient().signIn(user.email, user.password)).status).toBe(200);
    // Had the success counted, this fifth failure would already be refused with 429.
    expect((await new ApiClient().signIn(user.email, 'wrong-password')).status).toBe(401);
    expect((await new ApiClient().signIn(user.email, user.password)).status).toBe(429);
  });

  it('answers 429 after 50 failures from one client address, and only to that address', async () => {
    const address = `192.0.2.${Math.floor(Math.random() * 250) + 1}`;
    const client = new ApiClient(address);
    for (let i = 0; i < 50; i++) {
      // A different unknown e-mail each time, so that only the per-address limit can trip.
      const res = await client.signIn(`${unique(`spray${i}`)}@demo.test`, 'guess');
      expect(res.status, `failure ${i + 1}`).toBe(401);
    }
    const blocked = await client.signIn(DEMO.technician, DEMO_PASSWORD);
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0);
    expect((await new ApiClient().signIn(DEMO.technician, DEMO_PASSWORD)).status).toBe(200);
  });
});

describe('GET /api/me', () => {
  it('answers the signed-in user and company for every role', async () => {
    const expected = [
      [DEMO.apprentice, 'apprentice', 'Kestrel Valley Heating Co.'],
      [DEMO.technician, 'technician', 'Kestrel Valley Heating Co.'],
      [DEMO.lead, 'lead', 'Kestrel Valley Heating Co.'],
      [DEMO.lead2, 'lead', 'Kestrel Valley Heating Co.'],
      [DEMO.trainer, 'trainer', 'Kestrel Valley Heating Co.'],
      [DEMO.admin, 'admin', 'Kestrel Valley Heating Co.'],
      [DEMO.otherAdmin, 'admin', 'Ironbark Comfort Services'],
      [DEMO.otherTechnician, 'technician', 'Ironbark Comfort Services'],
    ] as const;
    for (const [email, role, company] of expected) {
      const client = await signedIn(email);
      const res = await client.get('/api/me');
      expect(res.status, email).toBe(200);
      expect(res.json).toMatchObject({ email, role, company: { name: company } });
      expect(Object.keys(res.json).sort()).toEqual(['company', 'email', 'id', 'name', 'role']);
    }
  });

  it('answers 401 without a session', async () => {
    const res = await new ApiClient().get('/api/me');
    expect(res.status).toBe(401);
    expect(res.json.error).toMatchObject({ code: 'unauthorized', message: expect.any(String) });
  });

  it('answers 401 to a forged or damaged cookie', async () => {
    const forged = await new ApiClient().call('GET', '/api/me', undefined, { headers: { cookie: 'pg_session=not-a-sealed-session' } });
    expect(forged.status).toBe(401);
    const client = await signedIn(DEMO.lead);
    const damaged = client.cookieHeader.replace(
      /pg_session=([^;]{10})/,
      (_m, head: string) => `pg_session=${[...head].reverse().join('')}`,
    );
    expect(damaged).not.toBe(client.cookieHeader);
    expect((await new ApiClient().call('GET', '/api/me', undefined, { headers: { cookie: damaged } })).status).toBe(401);
  });
});

describe('a cookie that is not a session of ours', () => {
  it('does not stop a sign-in, which replaces it', async () => {
    const res = await new ApiClient().call(
      'POST',
      SIGN_IN,
      { email: DEMO.lead, password: DEMO_PASSWORD },
      { headers: { cookie: 'pg_session=left-over-junk' } },
    );
    expect(res.status).toBe(200);
    const cookie = res.setCookies.find((c) => c.startsWith('pg_session='));
    expect(cookie).toMatch(/^pg_session=Fe26\.2\*/);
  });

  it('signs out with 204 and clears it', async () => {
    const res = await new ApiClient().call('POST', '/api/auth/sign-out', undefined, { headers: { cookie: 'pg_session=left-over-junk' } });
    expect(res.status).toBe(204);
    expect(res.setCookies.find((c) => c.startsWith('pg_session='))).toMatch(/^pg_session=;/);
  });
});

describe('POST /api/auth/sign-out', () => {
  it('answers 204, clears the cookie, and the session is gone', async () => {
    const client = await signedIn(DEMO.apprentice);
    expect((await client.get('/api/me')).status).toBe(200);
    const res = await client.post('/api/auth/sign-out');
    expect(res.status).toBe(204);
    expect(res.text).toBe('');
    const cleared = res.setCookies.find((c) => c.startsWith('pg_session='));
    expect(cleared).toBeDefined();
    expect(client.hasCookie('pg_session')).toBe(false);
    expect((await client.get('/api/me')).status).toBe(401);
  });

  it('answers 204 without a session too', async () => {
    expect((await new ApiClient().post('/api/auth/sign-out')).status).toBe(204);
  });

  it('leaves the other sessions of the same user alone', async () => {
    const phone = await signedIn(DEMO.lead2);
    const tablet = await signedIn(DEMO.lead2);
    expect((await phone.post('/api/auth/sign-out')).status).toBe(204);
    expect((await tablet.get('/api/me')).status).toBe(200);
  });
});
