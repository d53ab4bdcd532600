// Practice over HTTP: a trainer makes and assigns a scenario, the apprentice runs it on the bench
// through the bench API, reports a finding and gets a score worked out by the server; who may see
// and do what, and refusals that change nothing.
// @vitest-environment node
import { beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, DEMO, signedIn, unique } from '../support/http';

const unit = { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' } as const;

let trainer: ApiClient;
let apprentice: ApiClient;
let lead: ApiClient;
let otherAdmin: ApiClient;
let apprenticeId: string;

beforeAll(async () => {
  [trainer, apprentice, lead, otherAdmin] = await Promise.all([
    signedIn(DEMO.trainer),
    signedIn(DEMO.apprentice),
    signedIn(DEMO.lead),
    signedIn(DEMO.otherAdmin),
  ]);
  const overview = await trainer.get('/api/practice');
  expect(overview.status, overview.text).toBe(200);
  apprenticeId = overview.json.apprentices.find((a: { email: string }) => a.email === DEMO.apprentice).id;
});

async function scenarioFor(faultIds: string[]) {
  const created = await trainer.post('/api/practice/scenarios', {
    title: unique('Practice API'),
    faultIds,
    unit,
    notes: 'Customer: no heat',
    dueOn: '2027-03-01',
  });
  expect(created.status, created.text).toBe(201);
  const assigned = await trainer.post(`/api/practice/scenarios/${created.json.id}/assignments`, { apprenticeIds: [apprenticeId] });
  expect(assigned.status, assigned.text).toBe(200);
  expect(assigned.json.added).toBe(1);
  const mine = await apprentice.get('/api/practice/assignments');
  const assignment = mine.json.find((a: { scenarioId: string }) => a.scenarioId === created.json.id);
  return { scenarioId: created.json.id as string, assignment };
}

describe('practice scenarios', () => {
  it('refuses an unknown fault, a fault the unit cannot have and an empty title, and stores nothing', async () => {
    const before = (await trainer.get('/api/practice')).json.scenarios.length;
    const unknown = await trainer.post('/api/practice/scenarios', { title: 'X', faultIds: ['no-such-fault'], unit });
    expect(unknown.status).toBe(400);
    expect(unknown.json.error.message).toMatch(/Not a fault of the bench/);
    const misfit = await trainer.post('/api/practice/scenarios', {
      title: 'X',
      faultIds: ['inducer-motor-failed'],
      unit: { ...unit, draft: 'natural' },
    });
    expect(misfit.status).toBe(400);
    expect(misfit.json.error.message).toMatch(/Not possible on this unit profile/);
    const empty = await trainer.post('/api/practice/scenarios', { title: '  ', faultIds: ['blown-fuse'], unit });
    expect(empty.status).toBe(400);
    expect(empty.json.error.fieldErrors.title).toBeDefined();
    expect((await trainer.get('/api/practice')).json.scenarios.length).toBe(before);
  });

  it('keeps scenarios to trainers and to their company', async () => {
    const { scenarioId } = await scenarioFor(['blown-fuse']);
    expect((await apprentice.post('/api/practice/scenarios', { title: 'Mine', faultIds: ['blown-fuse'], unit })).status).toBe(403);
    expect((await lead.get(`/api/practice/scenarios/${scenarioId}`)).status).toBe(200);
    expect((await lead.post(`/api/practice/scenarios/${scenarioId}/assignments`, { apprenticeIds: [apprenticeId] })).status).toBe(403);
    expect((await otherAdmin.get(`/api/practice/scenarios/${scenarioId}`)).status).toBe(404);
  });

  it('never tells the apprentice which faults a scenario draws from', async () => {
    const { assignment } = await scenarioFor(['blown-fuse', 'open-high-limit']);
    expect(assignment).toBeDefined();
    expect(JSON.stringify(assignment)).not.toMatch(/blown-fuse|open-high-limit|faultIds/);
  });
});

describe('an attempt on the bench', () => {
  it('runs on its bench session, is scored by the server once, and shows the trainer the full path', async () => {
    const { scenarioId, assignment } = await scenarioFor(['blown-fuse']);
    const started = await apprentice.post(`/api/practice/assignments/${assignment.id}/attempts`, {});
    expect(started.status, started.text).toBe(201);
    const { id } = started.json;

    const running = await apprentice.get(`/api/practice/attempts/${id}`);
    expect(running.json.fault).toBeNull();
    expect(running.json.expectedFindings).toEqual([]);
    // The trainer may see what is injected; the session is not theirs to work.
    expect((await trainer.get(`/api/practice/attempts/${id}`)).json.fault.id).toBe('blown-fuse');

    const bench = `/api/practice/attempts/${id}/bench`;
    expect((await apprentice.post(`${bench}/actions`, { action: 'power-on' })).status).toBe(200);
    const secondary = await apprentice.post(`${bench}/measure`, { mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' });
    const pastFuse = await apprentice.post(`${bench}/measure`, { mode: 'vac', a: 'fuse-out', b: 'xfmr-common' });
    // A point the circuit does not have: refused in words, nothing stored (the path below has three events).
    const unknown = await apprentice.post(`${bench}/measure`, { mode: 'vac', a: 'xfmr-hot', b: 'no-such-point' });
    expect(unknown.status).toBe(400);
    expect(unknown.json.error.message).toMatch(/no-such-point/);
    expect((await trainer.post(`${bench}/measure`, { mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' })).status).toBe(403);
    // A blown fuse leaves 24 V at the secondary and none past the fuse (issue 9's physics; common practice, no source).
    expect(secondary.json.value).toBeGreaterThan(20);
    expect(pastFuse.json.value).toBeLessThan(2);

    // An apprentice cannot send a score; only the finding.
    const cheeky = await apprentice.post(`/api/practice/attempts/${id}/finish`, { findingStepId: 'f-blown-fuse', score: { total: 100 } });
    expect(cheeky.status).toBe(400);
    const done = await apprentice.post(`/api/practice/attempts/${id}/finish`, { findingStepId: 'f-blown-fuse' });
    expect(done.status, done.text).toBe(200);
    const lines = Object.fromEntries(done.json.score.lines.map((l: { key: string; points: number }) => [l.key, l.points]));
    expect(lines.finding).toBe(50);
    expect(lines.safety).toBe(20);
    expect(done.json.score.measurements).toBe(2);
    expect(done.json.fault.id).toBe('blown-fuse');

    expect((await apprentice.post(`/api/practice/attempts/${id}/finish`, { findingStepId: 'f-blown-fuse' })).status).toBe(409);
    // Scored: its bench is closed.
    expect((await apprentice.post(`${bench}/actions`, { action: 'wait', seconds: 5 })).status).toBe(409);
    const detail = await trainer.get(`/api/practice/scenarios/${scenarioId}`);
    const row = detail.json.attempts.find((a: { id: string }) => a.id === id);
    expect(row).toMatchObject({ right: true, total: done.json.score.total, faultId: 'blown-fuse' });
    const path = (await trainer.get(`/api/practice/attempts/${id}`)).json.events;
    expect(path.map((e: { kind: string }) => e.kind)).toEqual(['action', 'measure', 'measure']);
    const progress = await trainer.get(`/api/practice/apprentices/${apprenticeId}`);
    expect(progress.json.isolated.map((f: { faultId: string }) => f.faultId)).toContain('blown-fuse');
  });

  it('is the apprentice’s own: nobody else starts or finishes it', async () => {
    const { assignment } = await scenarioFor(['open-high-limit']);
    expect((await trainer.post(`/api/practice/assignments/${assignment.id}/attempts`, {})).status).toBe(403);
    const started = await apprentice.post(`/api/practice/assignments/${assignment.id}/attempts`, {});
    expect((await otherAdmin.get(`/api/practice/attempts/${started.json.id}`)).status).toBe(404);
    expect((await trainer.post(`/api/practice/attempts/${started.json.id}/finish`, { findingStepId: 'f-open-high-limit' })).status).toBe(
      403,
    );
  });
});
