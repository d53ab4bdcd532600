// Practice over HTTP: a trainer makes and assigns a scenario, the apprentice walks the tree on the
// attempt's bench (each answer checked against what the bench gave) to a finding, which the server
// scores; who may see and do what, and refusals that change nothing.
// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import { replayAnswers, stateIdOf } from '@/machines/diagnosis-machine';
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
  it('walks the tree on its bench: readings checked against the bench, scored by the server at the finding, the full path for the trainer', async () => {
    const { scenarioId, assignment } = await scenarioFor(['blown-fuse']);
    const started = await apprentice.post(`/api/practice/assignments/${assignment.id}/attempts`, {});
    expect(started.status, started.text).toBe(201);
    const { id } = started.json;

    const running = await apprentice.get(`/api/practice/attempts/${id}`);
    expect(running.json.fault).toBeNull();
    expect(running.json.expectedFindings).toEqual([]);
    expect(running.json.walk.path).toEqual([]);
    // The trainer may see what is injected; the session is not theirs to work.
    expect((await trainer.get(`/api/practice/attempts/${id}`)).json.fault.id).toBe('blown-fuse');

    const bench = `/api/practice/attempts/${id}/bench`;
    const answers = `/api/practice/attempts/${id}/answers`;
    const version = { id: running.json.walk.treeVersionId, version: running.json.walk.version, graph: DEFAULT_TREE_GRAPH };
    const walked: { stepId: string; value?: number; choice?: string; confirmed?: boolean }[] = [];
    const at = () => stateIdOf(replayAnswers(version, walked, { unit }).snapshot.value)!;
    const answer = async (body: Record<string, unknown>) => {
      const stepId = at();
      const res = await apprentice.post(answers, { clientId: randomUUID(), stepId, ...body });
      if (res.status === 200)
        walked.push({
          stepId,
          ...(res.json.answer.value !== null ? { value: res.json.answer.value } : {}),
          ...(res.json.answer.choice ? { choice: res.json.answer.choice } : {}),
          ...(res.json.answer.confirmed ? { confirmed: true } : {}),
        });
      return res;
    };
    const measure = async (a: string, b: string) => {
      const r = await apprentice.post(`${bench}/measure`, { mode: 'vac', a, b });
      expect(r.status, r.text).toBe(200);
      return r.json.value as number;
    };

    expect((await apprentice.post(`${bench}/actions`, { action: 'power-on' })).status).toBe(200);
    expect(at()).toBe('line-voltage');
    // A reading before the bench gave one, and one it never showed: refused in words, nothing stored.
    const early = await answer({ text: '120', unit: 'VAC' });
    expect(early.status).toBe(400);
    expect(early.json.error.message).toMatch(/Take this reading on the bench first/);
    const line = await measure('line-hot', 'line-neutral');
    const made = await answer({ text: String(line + 9), unit: 'VAC' });
    expect(made.status).toBe(400);
    expect(made.json.error.message).toMatch(/never showed that reading/);
    expect((await apprentice.get(`/api/practice/attempts/${id}`)).json.walk.path).toEqual([]);
    // A point the circuit does not have: refused in words, nothing stored on the bench either.
    const unknown = await apprentice.post(`${bench}/measure`, { mode: 'vac', a: 'xfmr-hot', b: 'no-such-point' });
    expect(unknown.status).toBe(400);
    expect(unknown.json.error.message).toMatch(/no-such-point/);
    expect((await trainer.post(`${bench}/measure`, { mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' })).status).toBe(403);
    // Nobody but the apprentice answers the walk.
    expect((await trainer.post(answers, { clientId: randomUUID(), stepId: 'line-voltage', text: String(line), unit: 'VAC' })).status).toBe(
      403,
    );

    expect((await answer({ text: String(line), unit: 'VAC' })).status).toBe(200);
    expect(at()).toBe('trial-observe');
    await apprentice.post(`${bench}/actions`, { action: 'call-for-heat' });
    await apprentice.post(`${bench}/actions`, { action: 'wait', seconds: 60 });
    const trial = await apprentice.post(`${bench}/observe`, { what: 'trial' });
    expect(trial.json.result).toBe('no-spark');
    expect((await answer({ choice: 'no-spark' })).status).toBe(200);
    expect(at()).toBe('transformer-secondary');
    const secondary = await measure('xfmr-hot', 'xfmr-common');
    // A blown fuse leaves 24 V at the secondary and none past the fuse (issue 9's physics; common practice, no source).
    expect(secondary).toBeGreaterThan(20);
    expect((await answer({ text: String(secondary), unit: 'VAC' })).status).toBe(200);
    const pastFuse = await measure('fuse-out', 'xfmr-common');
    expect(pastFuse).toBeLessThan(2);
    let last = await answer({ text: String(pastFuse), unit: 'VAC' });
    expect(last.status, last.text).toBe(200);
    // Before the fuse is handled, the power is turned off on the bench and verified dead.
    while (!last.json.scored) {
      if (at().startsWith('lock-out')) {
        const live = await answer({ confirmed: true });
        expect(live.status).toBe(400);
        expect(live.json.error.message).toMatch(/still powered/);
        await apprentice.post(`${bench}/actions`, { action: 'power-off' });
        expect(await measure('line-hot', 'line-neutral')).toBeLessThan(2);
      }
      last = await answer({ confirmed: true });
      expect(last.status, last.text).toBe(200);
    }

    const done = await apprentice.get(`/api/practice/attempts/${id}`);
    expect(done.json.finding.id).toBe('f-blown-fuse');
    const lines = Object.fromEntries(done.json.score.lines.map((l: { key: string; points: number }) => [l.key, l.points]));
    expect(lines.finding).toBe(50);
    expect(lines.safety).toBe(20);
    // Four meter readings and one look on the bench.
    expect(done.json.score.measurements).toBe(5);
    expect(done.json.fault.id).toBe('blown-fuse');
    expect(done.json.walk.path.map((p: { stepId: string }) => p.stepId).slice(0, 4)).toEqual([
      'line-voltage',
      'trial-observe',
      'transformer-secondary',
      'fuse-output',
    ]);

    // Scored once: the walk, the hand-picked finding and the bench are closed.
    expect((await apprentice.post(answers, { clientId: randomUUID(), stepId: 'fuse-output', confirmed: true })).status).toBe(409);
    expect((await apprentice.post(`/api/practice/attempts/${id}/finish`, { findingStepId: 'f-blown-fuse' })).status).toBe(409);
    expect((await apprentice.post(`${bench}/actions`, { action: 'wait', seconds: 5 })).status).toBe(409);
    const detail = await trainer.get(`/api/practice/scenarios/${scenarioId}`);
    const row = detail.json.attempts.find((a: { id: string }) => a.id === id);
    expect(row).toMatchObject({ right: true, total: done.json.score.total, faultId: 'blown-fuse' });
    const path = (await trainer.get(`/api/practice/attempts/${id}`)).json.events;
    expect(path.filter((e: { kind: string }) => e.kind !== 'action').map((e: { kind: string }) => e.kind)).toEqual([
      'measure',
      'observe',
      'measure',
      'measure',
      'measure',
    ]);
    const progress = await trainer.get(`/api/practice/apprentices/${apprenticeId}`);
    expect(progress.json.isolated.map((f: { faultId: string }) => f.faultId)).toContain('blown-fuse');
  });

  it('takes back the last answer for its apprentice only; the bench keeps what was done', async () => {
    const { assignment } = await scenarioFor(['open-high-limit']);
    const { id } = (await apprentice.post(`/api/practice/assignments/${assignment.id}/attempts`, {})).json;
    const bench = `/api/practice/attempts/${id}/bench`;
    await apprentice.post(`${bench}/actions`, { action: 'power-on' });
    const line = (await apprentice.post(`${bench}/measure`, { mode: 'vac', a: 'line-hot', b: 'line-neutral' })).json.value;
    const clientId = randomUUID();
    expect(
      (await apprentice.post(`/api/practice/attempts/${id}/answers`, { clientId, stepId: 'line-voltage', text: String(line), unit: 'VAC' }))
        .status,
    ).toBe(200);
    expect((await trainer.call('DELETE', `/api/practice/attempts/${id}/answers/last?last=${clientId}`)).status).toBe(403);
    expect((await apprentice.call('DELETE', `/api/practice/attempts/${id}/answers/last?last=${randomUUID()}`)).status).toBe(409);
    const undone = await apprentice.call('DELETE', `/api/practice/attempts/${id}/answers/last?last=${clientId}`);
    expect(undone.status, undone.text).toBe(200);
    expect(undone.json.path).toEqual([]);
    const attempt = (await trainer.get(`/api/practice/attempts/${id}`)).json;
    expect(attempt.walk.path).toEqual([]);
    expect(attempt.events.filter((e: { kind: string }) => e.kind === 'measure')).toHaveLength(1);
  });

  it('keeps one walk under parallel answers: of six answers to one step (two devices, retries) one lands', async () => {
    const { assignment } = await scenarioFor(['open-high-limit']);
    const { id } = (await apprentice.post(`/api/practice/assignments/${assignment.id}/attempts`, {})).json;
    const bench = `/api/practice/attempts/${id}/bench`;
    await apprentice.post(`${bench}/actions`, { action: 'power-on' });
    const line = (await apprentice.post(`${bench}/measure`, { mode: 'vac', a: 'line-hot', b: 'line-neutral' })).json.value;
    // Real parallel requests: the answers queue on the attempt's bench-session row lock.
    const results = await Promise.all(
      Array.from({ length: 6 }, () =>
        apprentice.post(`/api/practice/attempts/${id}/answers`, {
          clientId: randomUUID(),
          stepId: 'line-voltage',
          text: String(line),
          unit: 'VAC',
        }),
      ),
    );
    const statuses = results.map((r) => r.status);
    expect(
      statuses.filter((s) => s === 200),
      statuses.join(','),
    ).toHaveLength(1);
    // The others are refused in words (the walk has moved on past that step), never a server error.
    for (const r of results.filter((x) => x.status !== 200)) {
      expect([400, 409], r.text).toContain(r.status);
      expect(r.json.error.message.length).toBeGreaterThan(0);
    }
    const path = (await trainer.get(`/api/practice/attempts/${id}`)).json.walk.path;
    expect(path.map((p: { stepId: string }) => p.stepId)).toEqual(['line-voltage']);
  });

  it('is the apprentice’s own: nobody else starts or finishes it', async () => {
    const { assignment } = await scenarioFor(['open-high-limit']);
    expect((await trainer.post(`/api/practice/assignments/${assignment.id}/attempts`, {})).status).toBe(403);
    const started = await apprentice.post(`/api/practice/assignments/${assignment.id}/attempts`, {});
    expect((await otherAdmin.get(`/api/practice/attempts/${started.json.id}`)).status).toBe(404);
    expect((await trainer.post(`/api/practice/attempts/${started.json.id}/finish`, { findingStepId: 'f-open-high-limit' })).status).toBe(
      403,
    );
    // An admin (here of another company) is no apprentice: the role is refused before any row is read.
    expect(
      (
        await otherAdmin.post(`/api/practice/attempts/${started.json.id}/answers`, {
          clientId: randomUUID(),
          stepId: 'line-voltage',
          text: '120',
          unit: 'VAC',
        })
      ).status,
    ).toBe(403);
  });
});
