// The bench API over HTTP: a session of one's own, readings as the unit gives them at that moment,
// the refusals (an unknown point, another user's session, an apprentice asking which fault runs),
// and refusals storing nothing.
// @vitest-environment node
import { beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, DEMO, signedIn } from '../support/http';

const unit = { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' } as const;

let apprentice: ApiClient;
let trainer: ApiClient;
let technician: ApiClient;

beforeAll(async () => {
  [apprentice, trainer, technician] = await Promise.all([signedIn(DEMO.apprentice), signedIn(DEMO.trainer), signedIn(DEMO.technician)]);
});

async function session(client: ApiClient, faultId: string | null) {
  const res = await client.post('/api/bench/sessions', { faultId, unit, seed: 42 });
  expect(res.status, res.text).toBe(201);
  return res.json.id as string;
}

describe('bench API', () => {
  it('runs a blown-fuse bench: 24 V at xfmr-hot, 0 V past the fuse', async () => {
    const id = await session(apprentice, 'blown-fuse');
    expect((await apprentice.post(`/api/bench/sessions/${id}/actions`, { action: 'power-on' })).status).toBe(200);
    const call = await apprentice.post(`/api/bench/sessions/${id}/actions`, { action: 'call-for-heat' });
    expect(call.json.sequenceState).toBe('off');
    // A 24 VAC class secondary (TRADE.md).
    const sec = await apprentice.post(`/api/bench/sessions/${id}/measure`, { mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' });
    expect(sec.status, sec.text).toBe(200);
    expect(sec.json.unit).toBe('VAC');
    expect(sec.json.value).toBeGreaterThan(22);
    const past = await apprentice.post(`/api/bench/sessions/${id}/measure`, { mode: 'vac', a: 'fuse-out', b: 'xfmr-common' });
    expect(past.json.value).toBeLessThan(0.5);
    const state = await apprentice.get(`/api/bench/sessions/${id}`);
    expect(state.status).toBe(200);
    expect(state.json).toMatchObject({ id, powered: true, calling: true });
  });

  it('refuses an unknown point and ohms with power on in words, storing nothing', async () => {
    const id = await session(apprentice, null);
    await apprentice.post(`/api/bench/sessions/${id}/actions`, { action: 'power-on' });
    const before = (await apprentice.get(`/api/bench/sessions/${id}`)).json;
    const unknown = await apprentice.post(`/api/bench/sessions/${id}/measure`, { mode: 'vac', a: 'nowhere', b: 'chassis' });
    expect(unknown.status).toBe(400);
    expect(unknown.json.error.message).toMatch(/not a point/);
    const ohms = await apprentice.post(`/api/bench/sessions/${id}/measure`, { mode: 'ohm', a: 'limit-out', b: 'rollout-out' });
    expect(ohms.status).toBe(400);
    expect(ohms.json.error.message).toMatch(/power off/i);
    expect((await apprentice.get(`/api/bench/sessions/${id}`)).json).toEqual(before);
  });

  it('reads a gauge: the inlet pressure at rest, the spark gap with the power off only; an unknown gauge is refused', async () => {
    const id = await session(trainer, null);
    // A natural-gas inlet of about 7 inWC at rest (TRADE.md: common practice, no source).
    const inlet = await trainer.post(`/api/bench/sessions/${id}/measure`, { mode: 'gauge', gauge: 'inlet-pressure' });
    expect(inlet.status, inlet.text).toBe(200);
    expect(inlet.json.unit).toBe('inWC');
    expect(inlet.json.value).toBeGreaterThan(5);
    expect(inlet.json.value).toBeLessThan(9);
    // About 1/8 in (TRADE.md: common practice, no source).
    const gap = await trainer.post(`/api/bench/sessions/${id}/measure`, { mode: 'gauge', gauge: 'spark-gap' });
    expect(gap.json.value).toBeCloseTo(0.125, 1);
    await trainer.post(`/api/bench/sessions/${id}/actions`, { action: 'power-on' });
    const before = (await trainer.get(`/api/bench/sessions/${id}`)).json;
    const live = await trainer.post(`/api/bench/sessions/${id}/measure`, { mode: 'gauge', gauge: 'spark-gap' });
    expect(live.status).toBe(400);
    expect(live.json.error.message).toMatch(/power off/i);
    const unknown = await trainer.post(`/api/bench/sessions/${id}/measure`, { mode: 'gauge', gauge: 'tachometer' });
    expect(unknown.status).toBe(400);
    expect(unknown.json.error.message).toMatch(/no "tachometer" gauge/);
    // The stored gauge readings replay: the session still answers, unchanged by the refusals.
    expect((await trainer.get(`/api/bench/sessions/${id}`)).json).toEqual(before);
  });

  it("answers 404 for another user's session, whatever their role", async () => {
    const id = await session(apprentice, 'open-high-limit');
    expect((await technician.get(`/api/bench/sessions/${id}`)).status).toBe(404);
    expect((await trainer.post(`/api/bench/sessions/${id}/actions`, { action: 'power-on' })).status).toBe(404);
  });

  it('tells trainers which fault runs and apprentices not', async () => {
    const mine = await session(apprentice, 'open-high-limit');
    const state = await apprentice.get(`/api/bench/sessions/${mine}`);
    expect(state.json.fault).toBeUndefined();
    expect(state.text).not.toContain('high-limit');
    const faults = await apprentice.get('/api/bench/faults');
    expect(faults.status).toBe(200);
    expect(faults.json[0].description).toBeUndefined();
    const theirs = await session(trainer, 'open-high-limit');
    expect((await trainer.get(`/api/bench/sessions/${theirs}`)).json.fault.id).toBe('open-high-limit');
    const full = await trainer.get('/api/bench/faults');
    expect(full.json.find((f: { id: string }) => f.id === 'blown-fuse').description).toMatch(/fuse/);
  });

  it('keeps one sequence under parallel requests on one session', async () => {
    const id = await session(apprentice, null);
    const waits = await Promise.all(
      Array.from({ length: 6 }, () => apprentice.post(`/api/bench/sessions/${id}/actions`, { action: 'wait', seconds: 2 })),
    );
    for (const w of waits) expect([200, 409, 503]).toContain(w.status);
    const done = waits.filter((w) => w.status === 200).length;
    expect((await apprentice.get(`/api/bench/sessions/${id}`)).json.time).toBeCloseTo(2 * done, 5);
  });
});
