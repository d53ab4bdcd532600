// Under load and abuse, over HTTP against the built app: sessions that end, requests from
// elsewhere refused, the security headers, clean 4xx for what the app never takes, and saves that
// neither stall nor double under real parallel requests.
// @vitest-environment node
import { randomUUID } from 'node:crypto';
import http from 'node:http';
import knexFactory, { type Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, BASE_URL, DEMO, signedIn, unique } from '../support/http';

let db: Knex;
let versionId: string;
let unitId: string;

beforeAll(async () => {
  db = knexFactory({ client: 'pg', connection: process.env.DATABASE_URL, pool: { min: 0, max: 2 } });
  const tech = await signedIn(DEMO.technician);
  versionId = (await tech.get('/api/trees')).json.find((t: any) => t.published).published.id;
  const site = await tech.post('/api/sites', { name: unique('Hold-up site'), address: '9 Load Lane' });
  const unit = await tech.post('/api/units', {
    siteId: site.json.id,
    label: 'Hold-up furnace',
    ignition: 'two-rod',
    fuel: 'natural-gas',
    controlSupply: '24v',
    transformerVa: 40,
  });
  unitId = unit.json.id;
});

afterAll(async () => {
  await db.destroy();
});

async function newDiagnosis(client: ApiClient) {
  const call = await client.post('/api/calls', { unitId, complaint: 'No heat (load test)' });
  expect(call.status, call.text).toBe(201);
  const d = await client.post(`/api/calls/${call.json.id}/diagnoses`, { treeVersionId: versionId });
  expect(d.status, d.text).toBe(201);
  return { callId: call.json.id as string, id: d.json.id as string, step: d.json.step };
}

/** An answer to the step that lies on every path: the first band's middle, the first choice, or a confirmation. */
function answerFor(step: any) {
  if (step.kind === 'measure') {
    const b = step.bands.find((x: any) => x.from !== undefined && x.to !== undefined) ?? step.bands[0];
    const v = b.from !== undefined && b.to !== undefined ? (b.from + b.to) / 2 : b.from !== undefined ? b.from + 1 : b.to - 1;
    return { stepId: step.id, text: String(v), unit: step.unit };
  }
  if (step.kind === 'inspect') return { stepId: step.id, choice: step.choices[0].value };
  return { stepId: step.id, confirmed: true };
}

describe('sessions that end', () => {
  it('refuses a copied cookie once its session signed out, and stores nothing with it', async () => {
    const tech = await signedIn(DEMO.technician);
    const copy = tech.clone();
    expect((await copy.get('/api/me')).status).toBe(200);
    expect((await tech.post('/api/auth/sign-out')).status).toBe(204);
    expect((await copy.get('/api/me')).status).toBe(401);
    const name = unique('After sign-out');
    const made = await copy.post('/api/sites', { name, address: '1 Gone Rd' });
    expect(made.status).toBe(401);
    expect(await db('sites').where({ name }).first()).toBeUndefined();
  });

  it('signs out everywhere: every session of the user ends, another user’s does not', async () => {
    const a = await signedIn(DEMO.lead);
    const b = await signedIn(DEMO.lead);
    const someoneElse = await signedIn(DEMO.lead2);
    expect((await a.post('/api/auth/sign-out-everywhere')).status).toBe(204);
    expect((await a.get('/api/me')).status).toBe(401);
    expect((await b.get('/api/me')).status).toBe(401);
    expect((await someoneElse.get('/api/me')).status).toBe(200);
    expect((await (await signedIn(DEMO.lead)).get('/api/me')).status).toBe(200);
  });
});

describe('requests from elsewhere', () => {
  it('refuses a cross-site JSON request, a form or text/plain body, and a foreign Origin, changing nothing', async () => {
    const admin = await signedIn(DEMO.admin);
    const email = `${unique('csrf')}@demo.test`;
    const body = JSON.stringify({ email, name: 'Planted', role: 'admin', password: 'long-enough-123' });
    const foreign = await admin.post('/api/users', undefined, { raw: body, headers: { origin: 'http://127.0.0.1:1' } });
    expect(foreign.status).toBe(403);
    expect(foreign.json.error.message).toMatch(/another site/);
    const crossSite = await admin.post('/api/users', undefined, { raw: body, headers: { 'sec-fetch-site': 'cross-site' } });
    expect(crossSite.status).toBe(403);
    const textPlain = await admin.post('/api/users', undefined, { raw: body, headers: { 'content-type': 'text/plain' } });
    expect(textPlain.status).toBe(403);
    expect(textPlain.json.error.message).toMatch(/JSON/);
    const form = await admin.post('/api/sites', undefined, {
      raw: 'name=Planted&address=x',
      headers: { 'content-type': 'application/x-www-form-urlencoded', origin: BASE_URL },
    });
    expect(form.status).toBe(403);
    expect(await db('users').where({ email }).first()).toBeUndefined();
    // Our own pages' requests pass.
    const own = await admin.post('/api/users', undefined, { raw: body, headers: { origin: BASE_URL, 'sec-fetch-site': 'same-origin' } });
    expect(own.status, own.text).toBe(201);
  });
});

describe('headers on every response', () => {
  it('sets the CSP with a fresh nonce, frame-ancestors none, nosniff, a referrer policy; no-store on API JSON', async () => {
    const anon = new ApiClient();
    const pages = [await anon.get('/sign-in'), await anon.get('/sign-in')];
    const nonces = pages.map((p) => /'nonce-([^']+)'/.exec(p.headers.get('content-security-policy') ?? '')?.[1]);
    expect(nonces[0]).toBeTruthy();
    expect(nonces[0]).not.toBe(nonces[1]);
    expect(pages[0].text).toContain(`nonce="${nonces[0]}"`);
    const tech = await signedIn(DEMO.technician);
    const responses = [
      pages[0],
      await tech.get('/calls'),
      await tech.get('/api/me'),
      await anon.get('/api/me'),
      await anon.get('/no-such-page'),
      await tech.get('/api/calls/00000000-0000-4000-8000-000000000000'),
    ];
    const css = /\/_next\/static\/[^"]+\.css/.exec(pages[0].text)?.[0];
    expect(css).toBeTruthy();
    responses.push(await anon.get(css!));
    for (const res of responses) {
      expect(res.headers.get('content-security-policy'), res.text.slice(0, 80)).toMatch(/frame-ancestors 'none'/);
      expect(res.headers.get('x-content-type-options')).toBe('nosniff');
      expect(res.headers.get('referrer-policy')).toBeTruthy();
      expect(res.headers.get('x-frame-options')).toBe('DENY');
    }
    for (const res of responses.slice(2, 4)) expect(res.headers.get('cache-control')).toMatch(/no-store/);
  });
});

/** A raw request: Node's fetch refuses some methods (TRACE) and sets its own length. */
function rawRequest(
  method: string,
  path: string,
  headers: Record<string, string> = {},
  body?: Buffer,
): Promise<{ status: number; body: string }> {
  return new Promise((resolve, reject) => {
    const req = http.request(BASE_URL + path, { method, headers }, (res) => {
      let text = '';
      res.on('data', (c) => (text += c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: text }));
    });
    req.on('error', reject);
    if (body) req.end(body);
    else req.end();
  });
}

describe('clean refusals at the edge', () => {
  it('answers 405 for methods the app never takes, and 413 for a body over 1 MB', async () => {
    // TRACK and BREW are names Node's HTTP parser does not know: scripts/http-guard.cjs answers them.
    for (const method of ['TRACE', 'PROPFIND', 'MKCOL', 'TRACK', 'BREW']) {
      const res = await rawRequest(method, '/api/calls');
      expect(res.status, method).toBe(405);
    }
    const tech = await signedIn(DEMO.technician);
    const big = Buffer.alloc(2 * 1024 * 1024, 'a');
    const res = await rawRequest(
      'POST',
      '/api/sites',
      { 'content-type': 'application/json', cookie: tech.cookieHeader, 'content-length': String(big.length) },
      big,
    );
    expect(res.status).toBe(413);
    const unexported = await tech.call('DELETE', '/api/calls');
    expect(unexported.status).toBe(405);
  });
});

describe('pages answer their real status', () => {
  it('answers 404, not a 200 with the not-found page streamed in it, for a diagnosis or call that is not yours', async () => {
    const tech = await signedIn(DEMO.technician);
    const d = await newDiagnosis(tech);
    expect((await tech.get(`/calls/${d.callId}/diagnoses/${d.id}`)).status).toBe(200);
    const other = await signedIn(DEMO.otherTechnician);
    expect((await other.get(`/calls/${d.callId}/diagnoses/${d.id}`)).status).toBe(404);
    expect((await other.get(`/calls/${d.callId}`)).status).toBe(404);
    const apprentice = await signedIn(DEMO.apprentice);
    expect((await apprentice.get(`/calls/${d.callId}/diagnoses/${d.id}`)).status).toBe(404);
  });
});

describe('saves under real parallel requests', () => {
  it('stores exactly one answer for 20 copies of one save sent at once, and all of them get it', async () => {
    const tech = await signedIn(DEMO.technician);
    const d = await newDiagnosis(tech);
    const body = { clientId: randomUUID(), ...answerFor(d.step) };
    const health = tech.get('/api/health');
    const started = Date.now();
    const results = await Promise.all(Array.from({ length: 20 }, () => tech.post(`/api/diagnoses/${d.id}/answers`, body)));
    expect(Date.now() - started).toBeLessThan(10_000);
    expect(results.map((r) => r.status)).toEqual(Array(20).fill(200));
    expect(new Set(results.map((r) => r.json.answer.id)).size).toBe(1);
    expect((await health).status).toBe(200);
    const rows = await db('answers').where({ diagnosis_id: d.id });
    expect(rows).toHaveLength(1);
  });

  it('saves 64 answers on 64 diagnoses at once, in under 10 s, with no 500 and one row each', async () => {
    const clients = await Promise.all(Array.from({ length: 4 }, () => signedIn(DEMO.technician)));
    const diagnoses = [];
    for (let i = 0; i < 64; i++) diagnoses.push({ client: clients[i % 4], ...(await newDiagnosis(clients[i % 4])) });
    const started = Date.now();
    const health = (async () => {
      await new Promise((r) => setTimeout(r, 20));
      return clients[0].get('/api/health');
    })();
    const results = await Promise.all(
      diagnoses.map((d) => d.client.post(`/api/diagnoses/${d.id}/answers`, { clientId: randomUUID(), ...answerFor(d.step) })),
    );
    expect(Date.now() - started).toBeLessThan(10_000);
    expect(results.filter((r) => r.status >= 500)).toEqual([]);
    expect(results.map((r) => r.status)).toEqual(Array(64).fill(200));
    expect((await health).status).toBe(200);
    const counts = await db('answers')
      .whereIn(
        'diagnosis_id',
        diagnoses.map((d) => d.id),
      )
      .groupBy('diagnosis_id')
      .select('diagnosis_id')
      .count('* as n');
    expect(counts).toHaveLength(64);
    expect(counts.every((c: any) => Number(c.n) === 1)).toBe(true);
  });

  it('lets one of five closes of a call win; the others get 409', async () => {
    const tech = await signedIn(DEMO.technician);
    const call = await tech.post('/api/calls', { unitId, complaint: 'No heat (close race)' });
    const results = await Promise.all(
      Array.from({ length: 5 }, () => tech.post(`/api/calls/${call.json.id}/close`, { outcome: 'referred', reason: 'Part on order' })),
    );
    expect(results.map((r) => r.status).sort()).toEqual([200, 409, 409, 409, 409]);
  });

  it('lets one of several undos of the same last answer win; the others get 409 and nothing more is undone', async () => {
    const tech = await signedIn(DEMO.technician);
    const d = await newDiagnosis(tech);
    const first = await tech.post(`/api/diagnoses/${d.id}/answers`, { clientId: randomUUID(), ...answerFor(d.step) });
    const second = await tech.post(`/api/diagnoses/${d.id}/answers`, { clientId: randomUUID(), ...answerFor(first.json.next) });
    expect(second.status, second.text).toBe(200);
    const last = second.json.answer.clientId;
    const results = await Promise.all(
      Array.from({ length: 4 }, () => tech.call('DELETE', `/api/diagnoses/${d.id}/answers/last?last=${last}`)),
    );
    expect(results.map((r) => r.status).sort()).toEqual([200, 409, 409, 409]);
    const view = await tech.get(`/api/diagnoses/${d.id}`);
    expect(view.json.path).toHaveLength(1);
  });
  it('lands exactly one of several different answers to the same step sent at once; the others get 409', async () => {
    const tech = await signedIn(DEMO.technician);
    const d = await newDiagnosis(tech);
    const bodies = Array.from({ length: 6 }, () => ({ clientId: randomUUID(), ...answerFor(d.step) }));
    const results = await Promise.all(bodies.map((b) => tech.post(`/api/diagnoses/${d.id}/answers`, b)));
    expect(results.map((r) => r.status).sort()).toEqual([200, 409, 409, 409, 409, 409]);
    expect(results.find((r) => r.status === 409)!.json.error.message).toMatch(/Reload/);
    const rows = await db('answers').where({ diagnosis_id: d.id });
    expect(rows).toHaveLength(1);
    const view = await tech.get(`/api/diagnoses/${d.id}`);
    expect(view.json.path).toHaveLength(1);
    expect(view.json.current.id).toBe(results.find((r) => r.status === 200)!.json.next.id);
  });

  it('keeps the path and the stored rows in step when saves and undos of one diagnosis race', async () => {
    const tech = await signedIn(DEMO.technician);
    const d = await newDiagnosis(tech);
    const first = await tech.post(`/api/diagnoses/${d.id}/answers`, { clientId: randomUUID(), ...answerFor(d.step) });
    expect(first.status, first.text).toBe(200);
    const next = answerFor(first.json.next);
    const results = await Promise.all([
      ...Array.from({ length: 3 }, () => tech.post(`/api/diagnoses/${d.id}/answers`, { clientId: randomUUID(), ...next })),
      ...Array.from({ length: 3 }, () => tech.call('DELETE', `/api/diagnoses/${d.id}/answers/last?last=${first.json.answer.clientId}`)),
    ]);
    expect(results.filter((r) => r.status !== 200 && r.status !== 409)).toEqual([]);
    const saves = results.slice(0, 3).filter((r) => r.status === 200).length;
    const undos = results.slice(3).filter((r) => r.status === 200).length;
    // An undo names the first answer as the last one: it lands only before any second answer did.
    expect(saves + undos).toBeGreaterThanOrEqual(1);
    expect(saves).toBeLessThanOrEqual(1);
    expect(undos).toBeLessThanOrEqual(1);
    const rows = await db('answers').where({ diagnosis_id: d.id }).whereNull('undone_at').orderBy('seq');
    const view = await tech.get(`/api/diagnoses/${d.id}`);
    expect(view.json.path.map((a: any) => a.id)).toEqual(rows.map((r: any) => r.id));
    // Unit-record branches the diagnosis took by itself after a save are rows of their own.
    expect(rows.filter((r: any) => !r.auto)).toHaveLength(1 + saves - undos);
  });

  it('lets one of four escalations of a diagnosis win; the others get 409', async () => {
    const tech = await signedIn(DEMO.technician);
    const d = await newDiagnosis(tech);
    const results = await Promise.all(
      Array.from({ length: 4 }, (_, i) => tech.post(`/api/diagnoses/${d.id}/escalate`, { note: `Nothing fits (copy ${i})` })),
    );
    expect(results.map((r) => r.status).sort()).toEqual([200, 409, 409, 409]);
    const row = await db('diagnoses').where({ id: d.id }).first();
    expect(row.status).toBe('escalated');
  });

  it('stores no answer once its call is referred: a save and a referral at once end one way or the other', async () => {
    const tech = await signedIn(DEMO.technician);
    const d = await newDiagnosis(tech);
    const [save, refer] = await Promise.all([
      tech.post(`/api/diagnoses/${d.id}/answers`, { clientId: randomUUID(), ...answerFor(d.step) }),
      tech.post(`/api/calls/${d.callId}/close`, { outcome: 'referred', reason: 'Part on order' }),
    ]);
    expect([200, 409]).toContain(save.status);
    expect(refer.status, refer.text).toBe(200);
    const rows = await db('answers').where({ diagnosis_id: d.id });
    expect(rows).toHaveLength(save.status === 200 ? 1 : 0);
    const after = await tech.post(`/api/diagnoses/${d.id}/answers`, { clientId: randomUUID(), ...answerFor(d.step) });
    expect(after.status).toBe(409);
  });
});
