// Referring, reopening and reassigning a service call over HTTP: who may, what a refusal says, that a
// refusal changes nothing, that each change is recorded with who made it, and that of several at
// once exactly one wins.
// @vitest-environment node
import knexFactory, { type Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type ApiClient, DEMO, signedIn } from '../support/http';

let db: Knex;
let tech: ApiClient;
let lead: ApiClient;
let admin: ApiClient;
let unitId: string;
const people: Record<string, string> = {};

async function newCall(complaint: string) {
  const call = await tech.post('/api/calls', { unitId, complaint });
  expect(call.status, call.text).toBe(201);
  return call.json as { id: string; status: string; technicianId: string };
}

const eventsOf = (callId: string) =>
  db('call_events').where({ call_id: callId }).orderBy('at').select('kind', 'note', 'actor_id', 'from_user_id', 'to_user_id');
const rowOf = (callId: string) =>
  db('service_calls').where({ id: callId }).first('status', 'technician_id', 'closed_at', 'closed_by', 'repair_notes');

beforeAll(async () => {
  db = knexFactory({ client: 'pg', connection: process.env.DATABASE_URL, pool: { min: 0, max: 2 } });
  [tech, lead, admin] = await Promise.all([signedIn(DEMO.technician), signedIn(DEMO.lead), signedIn(DEMO.admin)]);
  for (const [key, email] of Object.entries({
    tech: DEMO.technician,
    lead: DEMO.lead,
    apprentice: DEMO.apprentice,
    trainer: DEMO.trainer,
    admin: DEMO.admin,
  })) {
    people[key] = (await db('users').whereRaw('lower(email) = ?', [email]).first('id')).id;
  }
  const site = await tech.post('/api/sites', { name: 'Referral row', address: '3 Dispatch Lane' });
  const unit = await tech.post('/api/units', {
    siteId: site.json.id,
    label: 'Crawlspace furnace',
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

describe('referring a call', () => {
  it('asks why, in words, and changes nothing without a reason', async () => {
    const call = await newCall('No heat (refer without a reason)');
    for (const body of [{ outcome: 'referred' }, { outcome: 'referred', reason: '   ' }]) {
      const res = await tech.post(`/api/calls/${call.id}/close`, body);
      expect(res.status, res.text).toBe(400);
      expect(res.json.error.fieldErrors.reason[0]).toMatch(/^Say why you refer the call/);
    }
    expect((await rowOf(call.id)).status).toBe('open');
    expect(await eventsOf(call.id)).toEqual([]);
  });

  it('records the reason and who referred it', async () => {
    const call = await newCall('No heat (referred)');
    const res = await tech.post(`/api/calls/${call.id}/close`, { outcome: 'referred', reason: 'Cracked heat exchanger: office to quote' });
    expect(res.status, res.text).toBe(200);
    expect(res.json.status).toBe('referred');
    expect(await eventsOf(call.id)).toEqual([
      { kind: 'referred', note: 'Cracked heat exchanger: office to quote', actor_id: people.tech, from_user_id: null, to_user_id: null },
    ]);
  });
});

describe('reopening a call', () => {
  it('is for leads and admins only, asks why, and answers 409 for a call that is not closed', async () => {
    const call = await newCall('No heat (reopen refusals)');
    expect((await lead.post(`/api/calls/${call.id}/reopen`, { reason: 'Too early' })).status).toBe(409);
    await tech.post(`/api/calls/${call.id}/close`, { outcome: 'referred', reason: 'Part on order' });
    const refused = await tech.post(`/api/calls/${call.id}/reopen`, { reason: 'I want it back' });
    expect(refused.status).toBe(403);
    const noReason = await lead.post(`/api/calls/${call.id}/reopen`, {});
    expect(noReason.status).toBe(400);
    expect(noReason.json.error.fieldErrors.reason).toEqual(['Say why the call is reopened.']);
    expect((await rowOf(call.id)).status).toBe('referred');
    expect((await eventsOf(call.id)).map((e) => e.kind)).toEqual(['referred']);
  });

  it('puts the call back where its work stood, clears the close and records who reopened it and why', async () => {
    const call = await newCall('No heat (reopened)');
    const repair = await tech.call('PUT', `/api/calls/${call.id}/repair`, { repairNotes: 'Cleaned the flame rod', cycles: 3 });
    expect(repair.status, repair.text).toBe(200);
    expect((await tech.post(`/api/calls/${call.id}/close`, { outcome: 'closed' })).status).toBe(200);
    const res = await lead.post(`/api/calls/${call.id}/reopen`, { reason: 'Customer called back: no heat again' });
    expect(res.status, res.text).toBe(200);
    expect(res.json).toMatchObject({ status: 'repaired', closedAt: null, closedByName: null });
    expect(await rowOf(call.id)).toMatchObject({ status: 'repaired', closed_at: null, closed_by: null });
    expect(await eventsOf(call.id)).toEqual([
      { kind: 'closed', note: null, actor_id: people.tech, from_user_id: null, to_user_id: null },
      { kind: 'reopened', note: 'Customer called back: no heat again', actor_id: people.lead, from_user_id: null, to_user_id: null },
    ]);
    // A call without a repair or a diagnosis goes back to open.
    const bare = await newCall('No heat (reopened bare)');
    await tech.post(`/api/calls/${bare.id}/close`, { outcome: 'referred', reason: 'Wrong address' });
    expect((await admin.post(`/api/calls/${bare.id}/reopen`, { reason: 'Address corrected' })).json.status).toBe('open');
  });

  it('lets one of five reopens at once win; the others get 409 and one reopening is recorded', async () => {
    const call = await newCall('No heat (reopen race)');
    await tech.post(`/api/calls/${call.id}/close`, { outcome: 'referred', reason: 'Part on order' });
    const results = await Promise.all(
      Array.from({ length: 5 }, (_, i) => lead.post(`/api/calls/${call.id}/reopen`, { reason: `Part arrived (${i})` })),
    );
    expect(results.map((r) => r.status).sort()).toEqual([200, 409, 409, 409, 409]);
    expect((await eventsOf(call.id)).filter((e) => e.kind === 'reopened')).toHaveLength(1);
  });
});

describe('reassigning a call', () => {
  it('is for leads and admins; it moves the call and records from whom to whom', async () => {
    const call = await newCall('No heat (reassigned)');
    expect(call.technicianId).toBe(people.tech);
    const refused = await tech.post(`/api/calls/${call.id}/assign`, { technicianId: people.apprentice });
    expect(refused.status).toBe(403);
    const res = await lead.post(`/api/calls/${call.id}/assign`, { technicianId: people.apprentice });
    expect(res.status, res.text).toBe(200);
    expect(res.json.technicianId).toBe(people.apprentice);
    expect(await eventsOf(call.id)).toEqual([
      { kind: 'reassigned', note: null, actor_id: people.lead, from_user_id: people.tech, to_user_id: people.apprentice },
    ]);
    // The technician no longer reaches a call of a lead; the apprentice now does.
    expect((await admin.post(`/api/calls/${call.id}/assign`, { technicianId: people.lead })).status).toBe(200);
    expect((await tech.get(`/api/calls/${call.id}`)).status).toBe(404);
  });

  it('refuses someone who is not a field user, the same technician, a bad id and a closed call, and changes nothing', async () => {
    const call = await newCall('No heat (reassign refusals)');
    const trainer = await lead.post(`/api/calls/${call.id}/assign`, { technicianId: people.trainer });
    expect(trainer.status).toBe(400);
    expect(trainer.json.error.fieldErrors.technicianId).toEqual(['Choose someone from the list.']);
    const same = await lead.post(`/api/calls/${call.id}/assign`, { technicianId: people.tech });
    expect(same.status).toBe(409);
    const bad = await lead.post(`/api/calls/${call.id}/assign`, { technicianId: 'someone' });
    expect(bad.status).toBe(400);
    expect(bad.json.error.fieldErrors.technicianId).toEqual(['Choose a technician from the list.']);
    await tech.post(`/api/calls/${call.id}/close`, { outcome: 'referred', reason: 'Part on order' });
    const closed = await lead.post(`/api/calls/${call.id}/assign`, { technicianId: people.apprentice });
    expect(closed.status).toBe(409);
    expect(closed.json.error.message).toMatch(/reopen it/);
    expect((await rowOf(call.id)).technician_id).toBe(people.tech);
    expect((await eventsOf(call.id)).map((e) => e.kind)).toEqual(['referred']);
  });
});
