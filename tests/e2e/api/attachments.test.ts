// @vitest-environment node
import { randomUUID } from 'node:crypto';
import knexFactory, { type Knex } from 'knex';
import sharp from 'sharp';
import { BASE_URL, DEMO, signedIn, type ApiClient } from '../support/http';

// Photos over HTTP against the served app, its S3 fake and PostgreSQL: the upload's 201 and its
// refusals (413, 415, a call out of reach), the signed-link redirect and the object behind it,
// the list, and removal while the call is open.

let db: Knex;
let tech: ApiClient;
let otherAdmin: ApiClient;
let apprentice: ApiClient;
let ownCall: string;
let leadCall: string;
let closedCall: string;
let answerId: string;
const answerClientId = randomUUID();

async function callFor(email: string, status = 'diagnosing') {
  const owner = await db('users').whereRaw('lower(email) = ?', [email]).first('id', 'company_id');
  const unit = await db('units').where({ company_id: owner.company_id }).first('id');
  const [call] = await db('service_calls')
    .insert({ company_id: owner.company_id, unit_id: unit.id, complaint: 'No heat (photo test)', technician_id: owner.id, status })
    .returning('id');
  return { id: call.id as string, owner };
}

async function upload(client: ApiClient, callId: string, bytes: Buffer, name: string, type: string, fields: Record<string, string> = {}) {
  const form = new FormData();
  form.set('file', new Blob([new Uint8Array(bytes)], { type }), name);
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  const res = await fetch(`${BASE_URL}/api/calls/${callId}/attachments`, {
    method: 'POST',
    headers: { cookie: client.cookieHeader },
    body: form,
  });
  const text = await res.text();
  return { status: res.status, json: text ? JSON.parse(text) : null };
}

const photo = (w: number, h: number) =>
  sharp({ create: { width: w, height: h, channels: 3, background: '#6b8e23' } })
    .jpeg()
    .toBuffer();

beforeAll(async () => {
  db = knexFactory({ client: 'pg', connection: process.env.DATABASE_URL, pool: { min: 0, max: 2 } });
  [tech, otherAdmin, apprentice] = await Promise.all([signedIn(DEMO.technician), signedIn(DEMO.otherAdmin), signedIn(DEMO.apprentice)]);
  const own = await callFor(DEMO.technician);
  ownCall = own.id;
  leadCall = (await callFor(DEMO.lead2)).id;
  closedCall = (await callFor(DEMO.technician, 'closed')).id;
  const version = await db('tree_versions').where({ company_id: own.owner.company_id, status: 'published' }).first('id');
  const [diagnosis] = await db('diagnoses')
    .insert({ company_id: own.owner.company_id, call_id: ownCall, tree_version_id: version.id, user_id: own.owner.id })
    .returning('id');
  const [answer] = await db('answers')
    .insert({
      company_id: own.owner.company_id,
      diagnosis_id: diagnosis.id,
      client_id: answerClientId,
      seq: 1,
      step_id: 'flame-signal',
      step_kind: 'measure',
      text: '0.4',
      value: 0.4,
      unit: 'µA',
    })
    .returning('id');
  answerId = answer.id;
});

afterAll(async () => {
  await db?.destroy();
});

describe('POST /api/calls/{id}/attachments', () => {
  it('stores a photo of a reading: 201 { id, url, thumbnailUrl }, a row, and a name of its own', async () => {
    const res = await upload(tech, ownCall, await photo(1200, 900), '../../etc/passwd.jpg', 'image/jpeg', { answerId });
    expect(res.status).toBe(201);
    expect(Object.keys(res.json).sort()).toEqual(['id', 'thumbnailUrl', 'url']);
    expect(res.json.url).toBe(`/api/attachments/${res.json.id}`);
    expect(res.json.thumbnailUrl).toBe(`/api/attachments/${res.json.id}?size=thumb`);
    const row = await db('attachments').where({ id: res.json.id }).first();
    expect(row).toMatchObject({ call_id: ownCall, answer_id: answerId, width: 1200, height: 900, content_type: 'image/webp' });
    expect(row.key).not.toContain('passwd');
    expect(row.key).toContain(res.json.id);
  });

  it('refuses a text file renamed .jpg with 415 and stores nothing', async () => {
    const before = await db('attachments').where({ call_id: ownCall }).count<{ n: string }[]>({ n: '*' });
    const res = await upload(tech, ownCall, Buffer.from('not a photo at all\n'), 'burner.jpg', 'image/jpeg');
    expect(res.status).toBe(415);
    expect(res.json.error.message).toMatch(/not a photo/);
    const after = await db('attachments').where({ call_id: ownCall }).count<{ n: string }[]>({ n: '*' });
    expect(after[0].n).toBe(before[0].n);
  });

  it('refuses a photo over 15 MB with 413', async () => {
    const jpeg = await photo(32, 32);
    const big = Buffer.concat([jpeg, Buffer.alloc(15 * 1024 * 1024 + 1 - jpeg.length)]);
    const res = await upload(tech, ownCall, big, 'big.jpg', 'image/jpeg');
    expect(res.status).toBe(413);
    expect(res.json.error.message).toMatch(/15 MB/);
  });

  it('refuses a body that is not multipart with 415, and an answer of another call with 400', async () => {
    const json = await tech.post(`/api/calls/${ownCall}/attachments`, { file: 'x' });
    expect(json.status).toBe(415);
    const other = await upload(tech, leadCall, await photo(64, 64), 'a.jpg', 'image/jpeg');
    expect(other.status).toBe(404);
    const wrongAnswer = await upload(tech, ownCall, await photo(64, 64), 'a.jpg', 'image/jpeg', { answerId: randomUUID() });
    expect(wrongAnswer.status).toBe(400);
  });

  it("answers 404 for someone else's call: an apprentice on a technician's, the other company on ours", async () => {
    expect((await upload(apprentice, ownCall, await photo(64, 64), 'a.jpg', 'image/jpeg')).status).toBe(404);
    expect((await upload(otherAdmin, ownCall, await photo(64, 64), 'a.jpg', 'image/jpeg')).status).toBe(404);
  });

  it('refuses a photo on a closed call with 409', async () => {
    const res = await upload(tech, closedCall, await photo(64, 64), 'a.jpg', 'image/jpeg');
    expect(res.status).toBe(409);
  });
});

describe('GET and DELETE /api/attachments/{id}', () => {
  it('redirects to a short-lived signed link that serves the stored WebP, and the thumbnail is small', async () => {
    const made = await upload(tech, ownCall, await photo(3000, 2000), 'rod.jpg', 'image/jpeg');
    expect(made.status).toBe(201);
    for (const [path, side] of [
      [made.json.url, 2048],
      [made.json.thumbnailUrl, 320],
    ] as const) {
      const res = await fetch(BASE_URL + path, { headers: { cookie: tech.cookieHeader }, redirect: 'manual' });
      expect(res.status).toBe(302);
      const location = res.headers.get('location')!;
      expect(location).toMatch(/X-Amz-Expires=300/);
      const object = await fetch(location);
      expect(object.status).toBe(200);
      const meta = await sharp(Buffer.from(await object.arrayBuffer())).metadata();
      expect(meta.format).toBe('webp');
      expect(meta.width).toBe(side);
    }
    // The app's own <img> elements get the bytes from the app under the same check.
    const inline = await fetch(BASE_URL + made.json.thumbnailUrl, { headers: { cookie: tech.cookieHeader, 'sec-fetch-dest': 'image' } });
    expect(inline.status).toBe(200);
    expect(inline.headers.get('content-type')).toBe('image/webp');
    // Another company's admin does not reach it; nor does an apprentice who is not on the call.
    expect((await otherAdmin.get(made.json.url)).status).toBe(404);
    expect((await apprentice.get(made.json.url)).status).toBe(404);
  });

  it('lists the photos of the call and removes one while the call is open', async () => {
    const made = await upload(tech, ownCall, await photo(200, 200), 'x.jpg', 'image/jpeg');
    const list = await tech.get(`/api/calls/${ownCall}/attachments`);
    expect(list.status).toBe(200);
    expect(list.json.editable).toBe(true);
    expect(list.json.photos.map((p: { id: string }) => p.id)).toContain(made.json.id);
    expect((await otherAdmin.call('DELETE', made.json.url)).status).toBe(404);
    const removed = await tech.call('DELETE', made.json.url);
    expect(removed.status).toBe(200);
    expect(await db('attachments').where({ id: made.json.id }).first()).toBeUndefined();
    expect((await tech.get(made.json.url)).status).toBe(404);
  });

  it('attaches by the client id the wizard made for the answer; the list names the answer by both ids', async () => {
    const made = await upload(tech, ownCall, await photo(300, 200), 'rod.jpg', 'image/jpeg', { answerId: answerClientId });
    expect(made.status).toBe(201);
    expect(await db('attachments').where({ id: made.json.id }).first('answer_id')).toEqual({ answer_id: answerId });
    const list = await tech.get(`/api/calls/${ownCall}/attachments`);
    expect(list.json.photos.find((p: { id: string }) => p.id === made.json.id)).toMatchObject({
      answerId,
      answerClientId,
      findingId: null,
    });
    expect((await tech.call('DELETE', made.json.url)).status).toBe(200);
  });

  it('keeps the photos of a closed call: removing one answers 409', async () => {
    const made = await upload(tech, ownCall, await photo(100, 100), 'y.jpg', 'image/jpeg');
    await db('service_calls').where({ id: ownCall }).update({ status: 'closed' });
    try {
      expect((await tech.call('DELETE', made.json.url)).status).toBe(409);
      expect(await db('attachments').where({ id: made.json.id }).first()).toBeDefined();
    } finally {
      await db('service_calls').where({ id: ownCall }).update({ status: 'diagnosing' });
    }
  });
});
