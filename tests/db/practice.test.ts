// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { appendBenchEvent, createBenchSession } from '@/db/bench';
import { db } from '@/db/knex';
import {
  assignScenario,
  createAttempt,
  createScenario,
  finishAttempt,
  getAssignment,
  getAttempt,
  listAssignments,
  listAttempts,
  listScenarios,
} from '@/db/practice';
import { createUser } from '@/db/users';
import { AppError } from '@/lib/errors';
import type { Scope } from '@/lib/policy';
import type { Score } from '@/lib/practice/scoring';
import type { CurrentUser } from '@/lib/server/guard';
import {
  attemptBenchAct,
  attemptBenchMeasure,
  attemptBenchState,
  attemptDetail,
  finishMyAttempt,
  startAttempt,
  toPracticeEvent,
} from '@/lib/server/practice';

// Two companies of this file's own; deleting them at the end removes everything made here (CASCADE).
const tag = randomUUID().slice(0, 8);
const unit = { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' } as const;
let companyA: string;
let companyB: string;
let trainer: string;
let noor: string;
let ravi: string;
let outsider: string;

const company = async (name: string) =>
  (
    await db('companies')
      .insert({ name, office_email: `office-${tag}@${name}.test` })
      .returning('id')
  )[0].id as string;
const person = async (companyId: string, local: string, role: 'apprentice' | 'trainer') =>
  (await createUser({ companyId, email: `${local}-${tag}@practice-test.test`, name: `${local} ${tag}`, role, passwordHash: 'x' })).id;

const scope = (companyId: string, userId: string, reach: Scope['reach']): Scope => ({ companyId, userId, reach });
const asUser = (id: string, companyId: string, role: 'apprentice' | 'trainer'): CurrentUser =>
  ({ id, companyId, role, name: 'Test', email: 't@test', companyName: 'Alpha', active: true }) as unknown as CurrentUser;

async function appError(promise: Promise<unknown>): Promise<AppError> {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(AppError);
  return error as AppError;
}

beforeAll(async () => {
  companyA = await company('alpha');
  companyB = await company('bravo');
  trainer = await person(companyA, 'trainer', 'trainer');
  noor = await person(companyA, 'noor', 'apprentice');
  ravi = await person(companyA, 'ravi', 'apprentice');
  outsider = await person(companyB, 'outsider', 'apprentice');
});

afterAll(async () => {
  await db('companies').whereIn('id', [companyA, companyB].filter(Boolean)).delete();
  await db.destroy();
});

const newScenario = (faultIds = ['blown-fuse']) =>
  createScenario({
    companyId: companyA,
    trainerId: trainer,
    input: { title: `Fuse ${tag}`, faultIds, unit, notes: 'No heat', dueOn: '2027-02-01' },
  });

describe('practice scenarios and assignments', () => {
  it('stores a scenario with its due date and counts', async () => {
    const s = await newScenario();
    expect(s).toMatchObject({ faultIds: ['blown-fuse'], unit, dueOn: '2027-02-01', assigned: 0, attempts: 0 });
    expect((await listScenarios({ companyId: companyA })).map((x) => x.id)).toContain(s.id);
    expect((await listScenarios({ companyId: companyB })).map((x) => x.id)).not.toContain(s.id);
  });

  it('assigns to many at once, keeps an existing assignment, and refuses an apprentice of another company with nothing assigned', async () => {
    const s = await newScenario();
    expect(await assignScenario({ companyId: companyA, scenarioId: s.id, apprenticeIds: [noor, ravi], by: trainer })).toBe(2);
    expect(await assignScenario({ companyId: companyA, scenarioId: s.id, apprenticeIds: [noor], by: trainer })).toBe(0);
    const refused = await appError(assignScenario({ companyId: companyA, scenarioId: s.id, apprenticeIds: [outsider, ravi], by: trainer }));
    expect(refused.code).toBe('bad_request');
    // A trainer is not an apprentice either.
    expect((await appError(assignScenario({ companyId: companyA, scenarioId: s.id, apprenticeIds: [trainer], by: trainer }))).code).toBe(
      'bad_request',
    );
    expect(await db('practice_assignments').where({ scenario_id: s.id }).count({ n: '*' })).toEqual([{ n: '2' }]);
    // The other company does not reach the scenario at all.
    expect((await appError(assignScenario({ companyId: companyB, scenarioId: s.id, apprenticeIds: [outsider], by: trainer }))).code).toBe(
      'not_found',
    );
  });

  it('shows an apprentice only their own assignments, the company everyone’s', async () => {
    const s = await newScenario();
    await assignScenario({ companyId: companyA, scenarioId: s.id, apprenticeIds: [noor, ravi], by: trainer });
    const mine = await listAssignments({ scope: scope(companyA, noor, 'own'), scenarioId: s.id });
    expect(mine.map((a) => a.apprentice.id)).toEqual([noor]);
    const all = await listAssignments({ scope: scope(companyA, trainer, 'company'), scenarioId: s.id });
    expect(all.map((a) => a.apprentice.id).sort()).toEqual([noor, ravi].sort());
    const ravis = all.find((a) => a.apprentice.id === ravi)!;
    expect((await appError(getAssignment({ scope: scope(companyA, noor, 'own'), id: ravis.id }))).code).toBe('not_found');
  });
});

describe('attempts', () => {
  it('records a finish once, and keeps another apprentice out', async () => {
    const s = await newScenario();
    await assignScenario({ companyId: companyA, scenarioId: s.id, apprenticeIds: [noor], by: trainer });
    const [assignment] = await listAssignments({ scope: scope(companyA, noor, 'own'), scenarioId: s.id });
    const session = await createBenchSession({ companyId: companyA, userId: noor, unit, faultId: 'blown-fuse', seed: 7 });
    const id = await createAttempt({ companyId: companyA, assignment, benchSessionId: session.id, faultId: 'blown-fuse' });
    const score: Score = { total: 80, max: 100, lines: [], safetyLapses: [], measurements: 3, shortest: 3, seconds: 60 };
    expect((await appError(getAttempt({ scope: scope(companyA, ravi, 'own'), id }))).code).toBe('not_found');
    const finished = await finishAttempt({
      scope: scope(companyA, noor, 'own'),
      id,
      findingStepId: 'f-blown-fuse',
      score,
      finishedAt: new Date(),
    });
    expect(finished.score?.total).toBe(80);
    const again = await appError(
      finishAttempt({ scope: scope(companyA, noor, 'own'), id, findingStepId: 'f-no-line-power', score, finishedAt: new Date() }),
    );
    expect(again.code).toBe('conflict');
    expect((await getAttempt({ scope: scope(companyA, trainer, 'company'), id })).findingStepId).toBe('f-blown-fuse');
    const [row] = await listAssignments({ scope: scope(companyA, noor, 'own'), scenarioId: s.id });
    expect(row.lastScore).toMatchObject({ total: 80, max: 100 });
    expect(await listAttempts({ scope: scope(companyB, outsider, 'company') })).toEqual([]);
  });

  it('is scored on the server from the stored bench events, the fault hidden from the apprentice until then', async () => {
    const s = await newScenario();
    await assignScenario({ companyId: companyA, scenarioId: s.id, apprenticeIds: [ravi], by: trainer });
    const [assignment] = await listAssignments({ scope: scope(companyA, ravi, 'own'), scenarioId: s.id });
    const me = asUser(ravi, companyA, 'apprentice');
    const own = scope(companyA, ravi, 'own');
    const started = await startAttempt({ user: me, scope: own, assignmentId: assignment.id });
    // Starting again resumes the open attempt.
    expect(await startAttempt({ user: me, scope: own, assignmentId: assignment.id })).toEqual(started);
    const running = await attemptDetail({ user: me, scope: own, id: started.id });
    expect(running.fault).toBeNull();
    expect(running.expectedFindings).toEqual([]);
    expect(running.events).toEqual([]);

    // What the bench API stores (db/bench.ts): a power-on, a live rod handled with an ohmmeter, two readings.
    const events = [
      { kind: 'action' as const, payload: { action: 'power-on' }, result: { time: 0, sequenceState: 'idle' }, simTime: 0 },
      {
        kind: 'measure' as const,
        payload: { mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' },
        result: { value: 24.4, unit: 'VAC', time: 1 },
        simTime: 1,
      },
      {
        kind: 'measure' as const,
        payload: { mode: 'vac', a: 'fuse-out', b: 'xfmr-common' },
        result: { value: 0.1, unit: 'VAC', time: 2 },
        simTime: 2,
      },
      {
        kind: 'measure' as const,
        payload: { mode: 'ohm', a: 'flame-rod', b: 'burner' },
        result: { value: null, unit: 'Ω', time: 3 },
        simTime: 3,
      },
    ];
    for (const [seq, e] of events.entries()) await appendBenchEvent({ sessionId: started.benchSessionId, seq, ...e });

    const done = await finishMyAttempt({ user: me, scope: own, id: started.id, findingStepId: 'f-no-line-power' });
    expect(done.score).not.toBeNull();
    expect(done.events).toHaveLength(4);
    expect(done.fault?.id).toBe('blown-fuse');
    expect(done.score!.measurements).toBe(3);
    expect(done.score!.safetyLapses).toHaveLength(1);
    const finding = done.score!.lines.find((l) => l.key === 'finding')!;
    expect(finding.points).toBe(0);
    // Nobody scores twice, and another apprentice cannot report a finding on it.
    expect((await appError(finishMyAttempt({ user: me, scope: own, id: started.id, findingStepId: 'f-no-line-power' }))).code).toBe(
      'conflict',
    );
    const other = asUser(noor, companyA, 'apprentice');
    expect(
      (await appError(finishMyAttempt({ user: other, scope: scope(companyA, noor, 'own'), id: started.id, findingStepId: 'x' }))).code,
    ).toBe('not_found');
  });

  it('refuses a finding that is not one of the tree and changes nothing', async () => {
    const s = await newScenario();
    await assignScenario({ companyId: companyA, scenarioId: s.id, apprenticeIds: [noor], by: trainer });
    const [assignment] = await listAssignments({ scope: scope(companyA, noor, 'own'), scenarioId: s.id });
    const me = asUser(noor, companyA, 'apprentice');
    const own = scope(companyA, noor, 'own');
    const started = await startAttempt({ user: me, scope: own, assignmentId: assignment.id });
    expect((await appError(finishMyAttempt({ user: me, scope: own, id: started.id, findingStepId: 'no-such-finding' }))).code).toBe(
      'bad_request',
    );
    expect((await getAttempt({ scope: own, id: started.id })).finishedAt).toBeNull();
  });
});

describe('the bench of a running attempt', () => {
  it('replays the stored events, stores each new reading, refuses in words without storing, and closes once scored', async () => {
    const s = await newScenario();
    await assignScenario({ companyId: companyA, scenarioId: s.id, apprenticeIds: [noor], by: trainer });
    const [assignment] = await listAssignments({ scope: scope(companyA, noor, 'own'), scenarioId: s.id });
    const me = asUser(noor, companyA, 'apprentice');
    const own = scope(companyA, noor, 'own');
    const { id, benchSessionId } = await startAttempt({ user: me, scope: own, assignmentId: assignment.id });
    const ctx = { user: me, scope: own, id };
    expect((await attemptBenchState(ctx)).powered).toBe(false);
    await attemptBenchAct(ctx, { action: 'power-on' });
    // Each request replays the session: the power stays on between them.
    expect((await attemptBenchState(ctx)).powered).toBe(true);
    // A blown fuse: 24 V at the secondary, about 0 V past the fuse (issue 9's physics rules; common practice, no source).
    expect((await attemptBenchMeasure(ctx, { mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' })).value).toBeGreaterThan(20);
    expect((await attemptBenchMeasure(ctx, { mode: 'vac', a: 'fuse-out', b: 'xfmr-common' })).value).toBeLessThan(2);
    const refused = await appError(attemptBenchMeasure(ctx, { mode: 'vac', a: 'xfmr-hot', b: 'nowhere' }));
    expect(refused.code).toBe('bad_request');
    expect(await db('bench_events').where({ session_id: benchSessionId }).count({ n: '*' })).toEqual([{ n: '3' }]);
    // Someone else's attempt is not found; nobody else works this bench.
    expect(
      (await appError(attemptBenchState({ user: asUser(ravi, companyA, 'apprentice'), scope: scope(companyA, ravi, 'own'), id }))).code,
    ).toBe('not_found');
    const done = await finishMyAttempt({ ...ctx, findingStepId: 'f-blown-fuse' });
    expect(done.score!.lines.find((l) => l.key === 'finding')!.points).toBe(50);
    expect(done.score!.measurements).toBe(2);
    expect((await appError(attemptBenchAct(ctx, { action: 'wait', seconds: 5 }))).code).toBe('conflict');
  });
});

describe('toPracticeEvent', () => {
  it('reads the bench API’s stored payloads and leaves out what it does not know', () => {
    expect(
      toPracticeEvent({
        kind: 'measure',
        payload: { mode: 'udc', series: 'ground-lead' },
        result: { value: 3.9, unit: 'µA', time: 4 },
        simTime: 4,
      }),
    ).toEqual([{ kind: 'measure', time: 4, mode: 'udc', series: 'ground-lead', value: 3.9 }]);
    expect(
      toPracticeEvent({
        kind: 'measure',
        payload: { mode: 'ohm', lead: 'spark-lead' },
        result: { value: null, unit: 'Ω', time: 5 },
        simTime: 5,
      }),
    ).toEqual([{ kind: 'measure', time: 5, mode: 'ohm', lead: 'spark-lead', value: null }]);
    expect(toPracticeEvent({ kind: 'observe', payload: { what: 'spark' }, result: { result: 'at-gap', time: 6 }, simTime: 6 })).toEqual([
      { kind: 'observe', time: 6, what: 'spark', result: 'at-gap' },
    ]);
    expect(toPracticeEvent({ kind: 'action', payload: { action: 'dance' }, result: {}, simTime: 1 })).toEqual([]);
    expect(toPracticeEvent({ kind: 'measure', payload: { mode: 'kelvin' }, result: {}, simTime: 1 })).toEqual([]);
  });
});
