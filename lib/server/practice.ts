import 'server-only';
import { appendBenchEvent, createBenchSession, getBenchSession, listBenchEvents, type BenchEventRecord } from '@/db/bench';
import { db } from '@/db/knex';
import {
  appendPracticeAnswer,
  assignScenario,
  createAttempt,
  deleteLastPracticeAnswer,
  getPublishedVersionId,
  listPracticeAnswers,
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
  type PracticeAnswerRecord,
} from '@/db/practice';
import { getTreeVersion } from '@/db/trees';
import { readAnswer } from '@/lib/answers';
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
  GAUGES,
  type GaugeId,
} from '@/lib/bench';
import { findingChoices, findingsWithTags, readingsToFinding } from '@/lib/practice/findings';
import { scoreAttempt, type PracticeEvent } from '@/lib/practice/scoring';
import { observeText, probeText, readingAnswers, sameReading } from '@/lib/practice/walk';
import type { CurrentUser } from '@/lib/server/guard';
import { notify } from '@/lib/server/notify';
import { authorize } from '@/lib/server/operation';
import { DEFAULT_TREE, DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import type { Step, TreeGraph, TreeVersion, UnitFacts } from '@/lib/trees/schema';
import type { AnswerInput } from '@/lib/validations/field';
import { apiAnswerSchema, type ApiAnswer, type DiagnosisViewOut } from '@/lib/validations/api';
import { currentStep, phaseOf, replayAnswers, stateIdOf, type DiagnosisAnswer } from '@/machines/diagnosis-machine';
import {
  assignmentSchema,
  practiceOverviewSchema,
  type AttemptOutput,
  type AttemptRow,
  type createScenarioSchema,
  type FindingChoice,
  type PracticeAnswerResult,
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
  if (p.mode === 'gauge') return [{ kind: 'measure', time, mode: 'gauge', gauge: str(p.gauge), value }];
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

// The tree versions attempts walk, by id: a published version never changes, so its graph is kept.
const walkedGraphs = new Map<string, { title: string; version: number; graph: TreeGraph }>();

async function walkedVersion(companyId: string, id: string, trx?: Parameters<typeof getTreeVersion>[1]) {
  const hit = walkedGraphs.get(id);
  if (hit) return hit;
  const record = await getTreeVersion({ companyId, id }, trx);
  const entry = { title: record.title, version: record.version, graph: record.graph };
  walkedGraphs.set(id, entry);
  return entry;
}

/** The graph an attempt's findings are of: its walked version's, else the built-in tree's. */
const graphOfAttempt = (a: Pick<Attempt, 'treeVersionId'>): TreeGraph =>
  (a.treeVersionId ? walkedGraphs.get(a.treeVersionId)?.graph : undefined) ?? DEFAULT_TREE_GRAPH;

async function loadWalked(companyId: string, attempts: readonly Attempt[]) {
  const ids = [...new Set(attempts.map((a) => a.treeVersionId).filter((v): v is string => v !== null))];
  await Promise.all(ids.map((id) => walkedVersion(companyId, id).catch(() => null)));
}

function findingTitle(graph: TreeGraph, id: string): FindingChoice | null {
  const step = graph.steps.find((st) => st.id === id && st.kind === 'finding');
  return step ? { id: step.id, title: step.title } : (findingById.get(id) ?? null);
}

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
  await loadWalked(scope.companyId, attempts);
  return { scenarios, apprentices, faults: practiceFaults(), attempts: attempts.map(toRow) };
}

export async function scenarioDetail({ scope, id }: { scope: Scope; id: string }) {
  const scenario = await getScenario({ companyId: scope.companyId, id });
  const [assignments, attempts] = await Promise.all([listAssignments({ scope, scenarioId: id }), listAttempts({ scope, scenarioId: id })]);
  await loadWalked(scope.companyId, attempts);
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
  // The walk is the company's published no-heat tree, as a real diagnosis of the symptom would be.
  const treeVersionId = await getPublishedVersionId({ companyId: user.companyId, slug: DEFAULT_TREE.slug });
  const id = await createAttempt({ companyId: user.companyId, assignment, benchSessionId, faultId, treeVersionId });
  return { id, benchSessionId };
}

/** The findings of the built-in tree that isolate a fault: those carrying every one of its expected tags. */
function expectedFindingsOf(faultId: string, graph: TreeGraph = DEFAULT_TREE_GRAPH): FindingChoice[] {
  const fault = getFault(faultId);
  if (!fault) return [];
  const tagged = findingsWithTags(graph, fault.expectedFindingTags);
  if (tagged.length) return tagged;
  if (graph !== DEFAULT_TREE_GRAPH) return expectedFindingsOf(faultId);
  // A tree whose findings do not carry the fault's own tag yet: the finding named after the fault.
  const named = findingById.get(`f-${fault.id}`);
  return named ? [named] : [];
}

function toRow(a: Attempt): AttemptRow {
  const fault = faultOf(a.faultId);
  const graph = graphOfAttempt(a);
  const finding = a.findingStepId ? (findingTitle(graph, a.findingStepId) ?? { id: a.findingStepId, title: a.findingStepId }) : null;
  const expected = expectedFindingsOf(a.faultId, graph);
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
    // The score's own finding line says whether it was right (scored against the attempt's tree).
    right: a.score
      ? a.score.lines.some((l) => l.key === 'finding' && l.points > 0)
      : a.findingStepId
        ? expected.some((f) => f.id === a.findingStepId)
        : null,
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
  const walked = a.treeVersionId ? await walkedVersion(scope.companyId, a.treeVersionId) : null;
  const graph = graphOfAttempt(a);
  const path = walked ? (await listPracticeAnswers({ companyId: scope.companyId, attemptId: a.id })).map(toApiAnswer) : [];
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
    findings: walked ? findingChoices(graph) : FINDINGS,
    finding: a.findingStepId ? findingTitle(graph, a.findingStepId) : null,
    fault: reveal ? fault : null,
    expectedFindings: reveal ? expectedFindingsOf(a.faultId, graph) : [],
    events,
    score: a.score,
    walk: walked ? { treeVersionId: a.treeVersionId!, title: walked.title, version: walked.version, path } : null,
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
  if (a.treeVersionId)
    throw new AppError('bad_request', 'This attempt walks the fault tree: it ends when the walk reaches a finding, not by picking one.');
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
  await loadWalked(scope.companyId, attempts);
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
    else if (e.kind === 'measure' && p.mode === 'gauge') bench.gauge(p.gauge as GaugeId);
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

export function attemptBenchMeasure(
  ctx: { user: CurrentUser; scope: Scope; id: string },
  input: MeasureRequest | { mode: 'gauge'; gauge: string },
) {
  return onAttemptBench(ctx, (bench) => {
    if (input.mode === 'gauge') {
      if (!(input.gauge in GAUGES)) throw new BenchRefusal('invalid', `The bench has no "${input.gauge}" gauge.`);
      const answer = bench.gauge(input.gauge as GaugeId);
      return { step: { kind: 'measure', payload: { ...input }, result: { ...answer }, simTime: answer.time }, answer };
    }
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

// ── The walk of a practice attempt: the real wizard's answers, checked against the bench ─────────
// A practice diagnosis walks the attempt's tree version in the wizard. Its answers are stored here,
// never trusted from the client: each is replayed through the diagnosis machine (the same one a
// real visit runs), a reading must be one the attempt's bench really gave at the step's probe (the
// function and points; without a probe, the meter function), a look on an inspect step that
// observes must be the choice the bench's last observation maps to, and an energy procedure that
// takes the power off is confirmed only with the bench powered off. Reaching a finding ends the
// attempt and scores it, with the walk's finding as the apprentice's.

const asDiagnosisAnswer = (a: ApiAnswer): DiagnosisAnswer => ({
  stepId: a.stepId,
  ...(a.overRange ? { overRange: true } : a.value !== null ? { value: a.value } : {}),
  ...(a.choice !== null ? { choice: a.choice } : {}),
  ...(a.confirmed !== null ? { confirmed: a.confirmed } : {}),
});

function toApiAnswer(r: PracticeAnswerRecord): ApiAnswer {
  return apiAnswerSchema.parse({ ...r.answer, seq: r.seq + 1, at: r.createdAt });
}

const refuse = (message: string, field = 'text') => new AppError('bad_request', message, { fieldErrors: { [field]: [message] } });

const unitFacts = (u: UnitProfile): UnitFacts => ({ ignition: u.ignition, fuel: u.fuel, controlSupply: u.controlSupply, draft: u.draft });

function benchPowered(events: readonly BenchEventRecord[]): boolean {
  let powered = false;
  for (const e of events) {
    if (e.kind !== 'action') continue;
    if (e.payload.action === 'power-on') powered = true;
    if (e.payload.action === 'power-off') powered = false;
  }
  return powered;
}

/** The walk of a running attempt, its bench locked: everything an answer or an undo is judged on. */
async function openWalk({ user, scope, id }: { user: CurrentUser; scope: Scope; id: string }, trx: Parameters<typeof getAttempt>[1]) {
  const a = await getAttempt({ scope, id }, trx);
  if (a.apprentice.id !== user.id) throw new AppError('forbidden', 'Only the apprentice running the attempt answers its steps.');
  if (a.finishedAt) throw new AppError('conflict', 'This attempt is finished and scored: its walk is closed.');
  if (!a.treeVersionId)
    throw new AppError('bad_request', 'This attempt has no fault tree to walk: report the finding you reached instead.');
  const own: Scope = { companyId: user.companyId, userId: user.id, reach: 'own' };
  // The bench session's row lock lines answers up with the bench's own events.
  const session = await getBenchSession({ scope: own, id: a.benchSessionId, lock: true }, trx);
  const [events, answers, walked] = await Promise.all([
    listBenchEvents({ companyId: user.companyId, sessionId: session.id }, trx),
    listPracticeAnswers({ companyId: user.companyId, attemptId: a.id }, trx),
    walkedVersion(user.companyId, a.treeVersionId, trx),
  ]);
  const version: TreeVersion = { id: a.treeVersionId, version: walked.version, graph: walked.graph };
  return { a, session, events, answers, walked, version };
}

function walkView(
  a: Attempt,
  walked: { title: string; version: number },
  path: ApiAnswer[],
  found: { findingId: string | null; energy: { electric: string; gas: string } },
): DiagnosisViewOut {
  return {
    id: a.id,
    callId: `practice-${a.id}`,
    status: found.findingId ? 'found' : 'in_progress',
    treeVersionId: a.treeVersionId!,
    tree: { title: walked.title, version: walked.version },
    startedBy: { id: a.apprentice.id, name: a.apprentice.name, role: 'apprentice' },
    signedOff: null,
    energy: found.energy.electric === 'off' ? 'locked-out' : 'energized',
    gas: found.energy.gas === 'off' ? 'off' : 'on',
    phase: 'walk',
    escalation: null,
    path,
    current: null,
    finding: null,
    contradictions: [],
    callStatus: 'diagnosing',
  } as DiagnosisViewOut;
}

/** The view the wizard starts from on a running attempt's page (its answers so far). */
export async function attemptWalkView({ user, scope, id }: { user: CurrentUser; scope: Scope; id: string }) {
  const a = await getAttempt({ scope, id });
  if (!a.treeVersionId) return null;
  const walked = await walkedVersion(scope.companyId, a.treeVersionId);
  const version: TreeVersion = { id: a.treeVersionId, version: walked.version, graph: walked.graph };
  const path = (await listPracticeAnswers({ companyId: scope.companyId, attemptId: a.id })).map(toApiAnswer);
  const unit = unitFacts(a.unit);
  const replay = replayAnswers(version, path.map(asDiagnosisAnswer), { unit });
  return {
    version,
    unit,
    view: walkView(a, walked, path, { findingId: replay.snapshot.context.findingId, energy: replay.snapshot.context.energy }),
    mine: a.apprentice.id === user.id,
  };
}

/** The bench event a reading or a look was taken from, judged against the step (or why it is refused). */
function benchEvidence(
  step: Step,
  value: number | null,
  choice: string | null,
  events: readonly BenchEventRecord[],
  since: number,
): { benchSeq: number | null } {
  const fresh = events.filter((e) => e.seq > since);
  if (step.kind === 'measure') {
    const taken = fresh.filter((e) => e.kind === 'measure' && readingAnswers(step, e.payload));
    if (taken.length === 0)
      throw refuse(`Take this reading on the bench first (${probeText(step)}): the step is answered with what the bench shows.`);
    // The latest matching reading first: the one just taken for this step.
    const hit = [...taken].reverse().find((e) => sameReading(value ?? Number.POSITIVE_INFINITY, num(e.result.value)));
    if (!hit) {
      const last = num(taken[taken.length - 1].result.value);
      throw refuse(
        `The bench never showed that reading: ${probeText(step)} it read ${last === null ? 'OL' : `${last} ${str(taken[taken.length - 1].result.unit)}`}. Enter what the bench shows.`,
      );
    }
    return { benchSeq: hit.seq };
  }
  if (step.kind === 'inspect' && step.observe) {
    // The first look, then the further ones in order: the first result that maps to a choice decides.
    let first: BenchEventRecord | undefined;
    for (const observation of [step.observe, ...(step.observeMore ?? [])]) {
      const look = fresh.filter((e) => e.kind === 'observe' && e.payload.what === observation.what).at(-1);
      if (!look) {
        if (!first)
          throw refuse(
            `Observe it on the bench first (${observeText(observation)}): the step is answered by what the bench shows.`,
            'choice',
          );
        break;
      }
      first ??= look;
      const result = str(look.result.result);
      const mapped = observation.choices[result];
      if (mapped === undefined) continue;
      if (mapped !== choice) {
        const label = step.choices.find((c) => c.value === mapped)?.label ?? mapped;
        throw refuse(
          `The bench showed “${result}” when you looked at the ${observation.what}, which is “${label}” on this step. Look again if the unit has changed.`,
          'choice',
        );
      }
      return { benchSeq: look.seq };
    }
    return { benchSeq: first!.seq };
  }
  return { benchSeq: null };
}

/** One answer of the apprentice's walk: checked, stored, and at a finding the attempt scored. */
export async function answerMyAttempt({
  user,
  scope,
  id,
  input,
}: {
  user: CurrentUser;
  scope: Scope;
  id: string;
  input: AnswerInput;
}): Promise<PracticeAnswerResult> {
  return db.transaction(async (trx) => {
    const { a, events, answers, version } = await openWalk({ user, scope, id }, trx);
    const path = answers.map(toApiAnswer);
    const unit = unitFacts(a.unit);
    const before = replayAnswers(version, path.map(asDiagnosisAnswer), { unit });
    const energyBefore = before.snapshot.context.energy;

    // A save sent again (the tablet retried): the stored answer, nothing changes.
    const again = answers.find((r) => r.clientId === input.clientId);
    if (again) {
      return {
        answer: toApiAnswer(again),
        next: null,
        finding: null,
        diagnosis: diagnosisOf(before.snapshot.context),
        auto: [],
        scored: false,
      };
    }

    const step = currentStep(before.snapshot);
    const stateId = stateIdOf(before.snapshot.value)!;
    if (input.stepId !== stateId) throw refuse(`The walk is at “${step.title}”, not at “${input.stepId}”. Reload the page.`, 'stepId');
    if (phaseOf(version, stateId) !== 'walk' && phaseOf(version, stateId) !== 'procedure')
      throw refuse('The walk has reached its finding: the attempt is being scored.', 'stepId');

    const base: ApiAnswer = {
      id: input.clientId,
      clientId: input.clientId,
      seq: answers.length + 1,
      stepId: step.id,
      stepTitle: step.title,
      kind: step.kind,
      text: null,
      value: null,
      unit: null,
      quantity: null,
      band: null,
      bandIndex: null,
      verdict: null,
      choice: null,
      choiceLabel: null,
      confirmed: null,
      overRange: false,
      auto: false,
      at: new Date().toISOString(),
    };
    const since = Math.max(-1, ...answers.map((r) => r.benchSeq ?? -1));
    let benchSeq: number | null = null;

    if (step.kind === 'finding' || step.kind === 'fact') throw refuse(`“${step.title}” is not answered by hand.`, 'stepId');
    const read = readAnswer(step, input, before.snapshot.context.readings);
    const { bandLabel, ...fields } = read.fields;
    Object.assign(base, { ...fields, band: bandLabel });
    const verdict: PracticeAnswerResult['verdict'] = read.verdict;
    // A reading or a look is one the bench gave since the last answer.
    if (step.kind === 'measure') ({ benchSeq } = benchEvidence(step, read.fields.value, null, events, since));
    else if (step.kind === 'inspect') ({ benchSeq } = benchEvidence(step, null, read.fields.choice, events, since));

    const after = replayAnswers(version, [...path, base].map(asDiagnosisAnswer), { unit });
    if (!after.ok) throw refuse(after.error, 'stepId');
    const energyAfter = after.snapshot.context.energy;
    // The procedure that takes the power off is done on the bench, not only ticked in the wizard.
    if (energyAfter.electric === 'off' && energyBefore.electric !== 'off' && benchPowered(events))
      throw refuse(
        'The bench is still powered: press Power off on the bench and verify it dead before you confirm this step.',
        'confirmed',
      );

    const stored = await appendPracticeAnswer(
      {
        companyId: user.companyId,
        attemptId: a.id,
        seq: answers.length,
        clientId: input.clientId,
        stepId: step.id,
        answer: { ...base, at: undefined },
        benchSeq,
      },
      trx,
    );
    const findingId = after.snapshot.context.findingId;
    let scored = false;
    if (findingId) {
      const finding = findingTitle(version.graph, findingId) ?? { id: findingId, title: findingId };
      await scoreAndFinish({ a, graph: version.graph, chosen: finding, events, scope, trx });
      scored = true;
    }
    return {
      answer: toApiAnswer(stored),
      next: null,
      finding: null,
      verdict,
      diagnosis: diagnosisOf(after.snapshot.context),
      auto: [],
      scored,
    };
  });
}

function diagnosisOf(ctx: { findingId: string | null; energy: { electric: string; gas: string } }): PracticeAnswerResult['diagnosis'] {
  return {
    status: ctx.findingId ? 'found' : 'in_progress',
    energy: ctx.energy.electric === 'off' ? 'locked-out' : 'energized',
    gas: ctx.energy.gas === 'off' ? 'off' : 'on',
    phase: 'walk',
    contradictions: [],
  };
}

async function scoreAndFinish({
  a,
  graph,
  chosen,
  events,
  scope,
  trx,
}: {
  a: Attempt;
  graph: TreeGraph;
  chosen: FindingChoice;
  events: readonly BenchEventRecord[];
  scope: Scope;
  trx: Parameters<typeof finishAttempt>[1];
}) {
  const expected = expectedFindingsOf(a.faultId, graph);
  const paths = expected.map((f) => readingsToFinding(graph, f.id, unitFacts(a.unit))).filter((n): n is number => n !== null);
  const finishedAt = new Date();
  const score = scoreAttempt({
    events: events.flatMap(toPracticeEvent),
    chosenFinding: chosen,
    expectedFindings: expected,
    shortest: paths.length ? Math.min(...paths) : 0,
    seconds: (finishedAt.getTime() - a.startedAt.getTime()) / 1000,
  });
  await finishAttempt({ scope, id: a.id, findingStepId: chosen.id, score, finishedAt }, trx);
}

/** Takes back the last answer of the walk (a mis-tap); what was done on the bench stays, and counts. */
export async function undoMyAnswer({
  user,
  scope,
  id,
  last,
}: {
  user: CurrentUser;
  scope: Scope;
  id: string;
  last?: string;
}): Promise<DiagnosisViewOut> {
  return db.transaction(async (trx) => {
    const { a, answers, walked, version } = await openWalk({ user, scope, id }, trx);
    const tail = answers[answers.length - 1];
    if (!tail) throw new AppError('bad_request', 'There is no answer to undo yet.');
    if (last && tail.clientId !== last) throw new AppError('conflict', 'The walk has moved on since: reload the page.');
    await deleteLastPracticeAnswer({ companyId: user.companyId, attemptId: a.id, seq: tail.seq }, trx);
    const path = answers.slice(0, -1).map(toApiAnswer);
    const replay = replayAnswers(version, path.map(asDiagnosisAnswer), { unit: unitFacts(a.unit) });
    return walkView(a, walked, path, { findingId: replay.snapshot.context.findingId, energy: replay.snapshot.context.energy });
  });
}
