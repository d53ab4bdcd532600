import 'server-only';
import { appendBenchEvent, createBenchSession, getBenchSession, listBenchEvents, type BenchEventRecord } from '@/db/bench';
import { db } from '@/db/knex';
import {
  assignScenario,
  createAttempt,
  createScenario,
  finishAttempt,
  getAssignment,
  getAttempt,
  getScenario,
  listApprentices,
  listAssignments,
  listAttempts,
  listAwaitingSignOff,
  listScenarios,
  type Attempt,
} from '@/db/practice';
import { AppError } from '@/lib/errors';
import type { Scope } from '@/lib/policy';
import {
  BenchRefusal,
  createBench,
  FAULTS,
  faultFits,
  getFault,
  type Bench,
  type BenchAction,
  type MeasureRequest,
  type ObservationKind,
} from '@/lib/bench';
import { findingChoices, findingsWithTags, readingsToFinding } from '@/lib/practice/findings';
import { scoreAttempt, type PracticeEvent } from '@/lib/practice/scoring';
import type { CurrentUser } from '@/lib/server/guard';
import { notify } from '@/lib/server/notify';
import { authorize } from '@/lib/server/operation';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import {
  assignmentSchema,
  practiceOverviewSchema,
  type AttemptOutput,
  type AttemptRow,
  type createScenarioSchema,
  type FindingChoice,
  type ProgressOutput,
  type UnitProfile,
} from '@/lib/validations/practice';
import type { z } from 'zod';

// Practice: trainers' scenarios and assignments, apprentices' attempts on the bench, and the score,
// which the server works out from the bench session's stored events when the apprentice reports the
// finding they reached. The findings to choose from and the finding each fault leads to are the
// built-in tree's (the bench's ground truth), whatever a company has done to its own tree.

// ── The bench sessions attempts run on (db/bench.ts, the bench API's own tables) ──────────────────

async function openBenchSession({ user, faultId, unit, seed }: { user: CurrentUser; faultId: string; unit: UnitProfile; seed: number }) {
  const session = await createBenchSession({ companyId: user.companyId, userId: user.id, unit, faultId, seed });
  return session.id;
}

const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : null);
const str = (v: unknown) => (typeof v === 'string' ? v : '');

/** A stored bench event as the scoring reads it; an event of another shape is left out. */
export function toPracticeEvent(e: Pick<BenchEventRecord, 'kind' | 'payload' | 'result' | 'simTime'>): PracticeEvent[] {
  const p = e.payload;
  const time = e.simTime;
  if (e.kind === 'action') {
    const action = str(p.action) as Extract<PracticeEvent, { kind: 'action' }>['action'];
    if (!['power-on', 'power-off', 'call-for-heat', 'end-call', 'reset-rollout', 'wait'].includes(action)) return [];
    return [{ kind: 'action', time, action, ...(num(p.seconds) !== null ? { seconds: num(p.seconds)! } : {}) }];
  }
  if (e.kind === 'observe') return [{ kind: 'observe', time, what: str(p.what), result: str(e.result.result) }];
  const value = num(e.result.value);
  if (p.mode === 'udc') return [{ kind: 'measure', time, mode: 'udc', series: str(p.series), value }];
  if (p.mode === 'ohm' && typeof p.lead === 'string') return [{ kind: 'measure', time, mode: 'ohm', lead: p.lead, value }];
  if (p.mode === 'vac' || p.mode === 'vdc' || p.mode === 'ohm')
    return [{ kind: 'measure', time, mode: p.mode, a: str(p.a), b: str(p.b), value }];
  return [];
}

async function benchEvents({ companyId, sessionId }: { companyId: string; sessionId: string }): Promise<PracticeEvent[]> {
  return (await listBenchEvents({ companyId, sessionId })).flatMap(toPracticeEvent);
}

const FINDINGS = findingChoices(DEFAULT_TREE_GRAPH);
const findingById = new Map(FINDINGS.map((f) => [f.id, f]));

function faultOf(id: string) {
  const fault = getFault(id);
  return fault ? { id: fault.id, title: fault.title, description: fault.description } : { id, title: id, description: '' };
}

export function practiceFaults() {
  return FAULTS.map((f) => ({ id: f.id, title: f.title, description: f.description }));
}

function checkFaults(ids: readonly string[], unit: UnitProfile) {
  const unknown = ids.filter((id) => !getFault(id));
  if (unknown.length) {
    const message = `Not a fault of the bench: ${unknown.join(', ')}.`;
    throw new AppError('bad_request', message, { fieldErrors: { faultIds: [message] } });
  }
  const misfits = ids.filter((id) => !faultFits(getFault(id)!, unit));
  if (misfits.length) {
    const message = `Not possible on this unit profile: ${misfits.map((id) => getFault(id)!.title).join(', ')}.`;
    throw new AppError('bad_request', message, { fieldErrors: { faultIds: [message] } });
  }
}

export async function addScenario({ user, input }: { user: CurrentUser; input: z.output<typeof createScenarioSchema> }) {
  checkFaults(input.faultIds, input.unit);
  return createScenario({ companyId: user.companyId, trainerId: user.id, input });
}

/** The trainer's home section: their company's scenarios and the latest attempts. */
export async function trainerHomeData() {
  const { scope } = await authorize('practice.overview');
  const o = practiceOverviewSchema.parse(await practiceOverview({ scope }));
  return { scenarios: o.scenarios, attempts: o.attempts };
}

/** The apprentice's home section: their assignments with due dates and last scores. */
export async function apprenticeHomeData() {
  const { scope } = await authorize('practice.assignments.list');
  return {
    assignments: assignmentSchema
      .omit({ apprentice: true })
      .array()
      .parse(await myAssignments({ scope })),
  };
}

export async function practiceOverview({ scope }: { scope: Scope }) {
  const [scenarios, apprentices, attempts] = await Promise.all([
    listScenarios({ companyId: scope.companyId }),
    listApprentices({ companyId: scope.companyId }),
    listAttempts({ scope }),
  ]);
  return { scenarios, apprentices, faults: practiceFaults(), attempts: attempts.map(toRow) };
}

export async function scenarioDetail({ scope, id }: { scope: Scope; id: string }) {
  const scenario = await getScenario({ companyId: scope.companyId, id });
  const [assignments, attempts] = await Promise.all([listAssignments({ scope, scenarioId: id }), listAttempts({ scope, scenarioId: id })]);
  return {
    scenario,
    faults: scenario.faultIds.map(faultOf),
    assignments: assignments.map((a) => ({ id: a.id, apprentice: a.apprentice, assignedAt: a.assignedAt })),
    attempts: attempts.map(toRow),
  };
}

export async function assignToApprentices({ user, id, apprenticeIds }: { user: CurrentUser; id: string; apprenticeIds: string[] }) {
  const added = await assignScenario({ companyId: user.companyId, scenarioId: id, apprenticeIds, by: user.id });
  const { title } = await getScenario({ companyId: user.companyId, id });
  for (const apprenticeId of new Set(apprenticeIds)) {
    await notify({
      kind: 'scenario',
      companyId: user.companyId,
      actorId: user.id,
      assignmentId: `${id}:${apprenticeId}`,
      apprenticeId,
      scenarioTitle: title,
    });
  }
  return { added };
}

export async function myAssignments({ scope }: { scope: Scope }) {
  // An apprentice never learns which faults a scenario draws from.
  return (await listAssignments({ scope })).map(({ faultIds: _faults, ...rest }) => rest);
}

/** Start an attempt: draw the fault from the scenario's set and open a bench session on it. */
export async function startAttempt({ user, scope, assignmentId }: { user: CurrentUser; scope: Scope; assignmentId: string }) {
  const assignment = await getAssignment({ scope, id: assignmentId });
  if (assignment.apprentice.id !== user.id) throw new AppError('forbidden', 'Only the apprentice it is assigned to runs a scenario.');
  if (assignment.openAttemptId) {
    const open = await getAttempt({ scope, id: assignment.openAttemptId });
    return { id: open.id, benchSessionId: open.benchSessionId };
  }
  const faultId = assignment.faultIds[Math.floor(Math.random() * assignment.faultIds.length)];
  const benchSessionId = await openBenchSession({ user, faultId, unit: assignment.unit, seed: Math.floor(Math.random() * 2 ** 31) });
  const id = await createAttempt({ companyId: user.companyId, assignment, benchSessionId, faultId });
  return { id, benchSessionId };
}

/** The findings of the built-in tree that isolate a fault: those carrying every one of its expected tags. */
function expectedFindingsOf(faultId: string): FindingChoice[] {
  const fault = getFault(faultId);
  if (!fault) return [];
  const tagged = findingsWithTags(DEFAULT_TREE_GRAPH, fault.expectedFindingTags);
  if (tagged.length) return tagged;
  // A tree whose findings do not carry the fault's own tag yet: the finding named after the fault.
  const named = findingById.get(`f-${fault.id}`);
  return named ? [named] : [];
}

function toRow(a: Attempt): AttemptRow {
  const fault = faultOf(a.faultId);
  const finding = a.findingStepId ? (findingById.get(a.findingStepId) ?? { id: a.findingStepId, title: a.findingStepId }) : null;
  const expected = expectedFindingsOf(a.faultId);
  return {
    id: a.id,
    scenarioId: a.scenarioId,
    scenarioTitle: a.scenarioTitle,
    apprenticeId: a.apprentice.id,
    apprenticeName: a.apprentice.name,
    faultId: a.faultId,
    faultTitle: fault.title,
    findingStepId: a.findingStepId,
    findingTitle: finding?.title ?? null,
    right: a.findingStepId ? expected.some((f) => f.id === a.findingStepId) : null,
    total: a.score?.total ?? null,
    max: a.score?.max ?? null,
    seconds: a.score?.seconds ?? null,
    safetyLapses: a.score ? a.score.safetyLapses.length : null,
    startedAt: a.startedAt.toISOString(),
    finishedAt: a.finishedAt ? a.finishedAt.toISOString() : null,
  };
}

/** An attempt in full; while it runs, its own apprentice sees neither the fault nor the expected finding. */
export async function attemptDetail({ user, scope, id }: { user: CurrentUser; scope: Scope; id: string }): Promise<AttemptOutput> {
  const a = await getAttempt({ scope, id });
  const reveal = a.finishedAt !== null || user.role !== 'apprentice';
  const events = reveal ? await benchEvents({ companyId: scope.companyId, sessionId: a.benchSessionId }) : [];
  const fault = faultOf(a.faultId);
  return {
    id: a.id,
    scenarioId: a.scenarioId,
    title: a.scenarioTitle,
    notes: a.notes,
    unit: a.unit,
    apprentice: a.apprentice,
    benchSessionId: a.benchSessionId,
    startedAt: a.startedAt.toISOString(),
    finishedAt: a.finishedAt ? a.finishedAt.toISOString() : null,
    findings: FINDINGS,
    finding: a.findingStepId ? (findingById.get(a.findingStepId) ?? null) : null,
    fault: reveal ? fault : null,
    expectedFindings: reveal ? expectedFindingsOf(a.faultId) : [],
    events,
    score: a.score,
  };
}

/** The apprentice reports the finding; the server scores the attempt from the bench session's events. */
export async function finishMyAttempt({
  user,
  scope,
  id,
  findingStepId,
}: {
  user: CurrentUser;
  scope: Scope;
  id: string;
  findingStepId: string;
}): Promise<AttemptOutput> {
  const a = await getAttempt({ scope, id });
  if (a.apprentice.id !== user.id) throw new AppError('forbidden', 'Only the apprentice running the attempt reports its finding.');
  if (a.finishedAt) throw new AppError('conflict', 'This attempt is already finished and scored.');
  const chosen = findingById.get(findingStepId);
  if (!chosen) {
    throw new AppError('bad_request', 'That is not one of the findings to choose from.', {
      fieldErrors: { findingStepId: ['Choose one of the findings in the list.'] },
    });
  }
  const expected = expectedFindingsOf(a.faultId);
  const events = await benchEvents({ companyId: scope.companyId, sessionId: a.benchSessionId });
  const paths = expected.map((f) => readingsToFinding(DEFAULT_TREE_GRAPH, f.id, a.unit)).filter((n): n is number => n !== null);
  const shortest = paths.length ? Math.min(...paths) : 0;
  const finishedAt = new Date();
  const score = scoreAttempt({
    events,
    chosenFinding: chosen,
    expectedFindings: expected,
    shortest,
    seconds: (finishedAt.getTime() - a.startedAt.getTime()) / 1000,
  });
  await finishAttempt({ scope, id, findingStepId, score, finishedAt });
  return attemptDetail({ user, scope, id });
}

export async function apprenticeProgress({ scope, apprenticeId }: { scope: Scope; apprenticeId: string }): Promise<ProgressOutput> {
  const apprentices = await listApprentices({ companyId: scope.companyId });
  const apprentice = apprentices.find((p) => p.id === apprenticeId);
  if (!apprentice) throw new AppError('not_found', 'That apprentice was not found.');
  const [attempts, awaiting] = await Promise.all([
    listAttempts({ scope, apprenticeId }),
    listAwaitingSignOff({ companyId: scope.companyId, apprenticeId }),
  ]);
  const rows = attempts.map(toRow);
  const isolated = new Map<string, { faultId: string; faultTitle: string; best: number; times: number }>();
  for (const r of rows) {
    if (!r.right) continue;
    const seen = isolated.get(r.faultId) ?? { faultId: r.faultId, faultTitle: r.faultTitle, best: 0, times: 0 };
    seen.best = Math.max(seen.best, r.total ?? 0);
    seen.times += 1;
    isolated.set(r.faultId, seen);
  }
  return {
    apprentice,
    attempts: rows,
    isolated: [...isolated.values()],
    awaitingSignOff: awaiting.map((d) => ({ ...d, at: d.at.toISOString() })),
  };
}

// ── Working the bench of a running attempt ──────────────────────────────────────────────────────
// The apprentice's own attempt, while it runs: the session is replayed from its events under its row
// lock, the new action or reading is taken, and stored as the next event (what the score reads).

type BenchStep = {
  kind: 'action' | 'measure' | 'observe';
  payload: Record<string, unknown>;
  result: Record<string, unknown>;
  simTime: number;
};

function replay(bench: Bench, events: readonly BenchEventRecord[]) {
  for (const e of events) {
    const p = e.payload;
    if (e.kind === 'action') bench.act(p.action as BenchAction, typeof p.seconds === 'number' ? p.seconds : undefined);
    else if (e.kind === 'measure') bench.measure(p as unknown as MeasureRequest);
    else bench.observe(p.what as ObservationKind);
  }
}

async function onAttemptBench<T>(
  { user, scope, id }: { user: CurrentUser; scope: Scope; id: string },
  work: (bench: Bench) => { step: BenchStep | null; answer: T },
): Promise<T> {
  const a = await getAttempt({ scope, id });
  if (a.apprentice.id !== user.id) throw new AppError('forbidden', 'Only the apprentice running the attempt works its bench.');
  if (a.finishedAt) throw new AppError('conflict', 'This attempt is finished and scored: its bench is closed.');
  return db.transaction(async (trx) => {
    const own: Scope = { companyId: user.companyId, userId: user.id, reach: 'own' };
    const session = await getBenchSession({ scope: own, id: a.benchSessionId, lock: true }, trx);
    const events = await listBenchEvents({ companyId: user.companyId, sessionId: session.id }, trx);
    const bench = createBench({ unit: session.unit, faultId: session.faultId, seed: session.seed });
    replay(bench, events);
    let outcome: { step: BenchStep | null; answer: T };
    try {
      outcome = work(bench);
    } catch (error) {
      if (error instanceof BenchRefusal) throw new AppError('bad_request', error.message);
      throw error;
    }
    if (outcome.step) await appendBenchEvent({ sessionId: session.id, seq: events.length, ...outcome.step }, trx);
    return outcome.answer;
  });
}

export function attemptBenchState(ctx: { user: CurrentUser; scope: Scope; id: string }) {
  return onAttemptBench(ctx, (bench) => ({ step: null, answer: { id: ctx.id, ...bench.snapshot() } }));
}

export function attemptBenchAct(ctx: { user: CurrentUser; scope: Scope; id: string }, input: { action: BenchAction; seconds?: number }) {
  return onAttemptBench(ctx, (bench) => {
    const answer = bench.act(input.action, input.seconds);
    return { step: { kind: 'action', payload: { ...input }, result: { ...answer }, simTime: answer.time }, answer };
  });
}

export function attemptBenchMeasure(ctx: { user: CurrentUser; scope: Scope; id: string }, input: MeasureRequest) {
  return onAttemptBench(ctx, (bench) => {
    const answer = bench.measure(input);
    return { step: { kind: 'measure', payload: { ...input }, result: { ...answer }, simTime: answer.time }, answer };
  });
}

export function attemptBenchObserve(ctx: { user: CurrentUser; scope: Scope; id: string }, input: { what: string }) {
  return onAttemptBench(ctx, (bench) => {
    const answer = bench.observe(input.what as ObservationKind);
    return { step: { kind: 'observe', payload: { what: input.what }, result: { ...answer }, simTime: answer.time }, answer };
  });
}
