import 'server-only';
import type { Knex } from 'knex';
import { CLOSED_STATUSES, getCall, recordCallEvent, setCallStatus } from '@/db/calls';
import {
  createDiagnosis,
  escalateDiagnosis,
  getCallOfDiagnosis,
  commitSave,
  getDiagnosis,
  insertAnswer,
  listAnswersForDiagnoses,
  listDiagnosesForCall,
  listPathAnswers,
  markAnswerUndone,
  maxAnswerSeq,
  saveDiagnosisState,
  readForSave,
  signOffDiagnosis,
  type AnswerRecord,
  type DiagnosisRecord,
  type NewAnswer,
} from '@/db/diagnoses';
import { db } from '@/db/knex';
import { getTreeVersion, type TreeVersionRecord } from '@/db/trees';
import { getUnit } from '@/db/units';
import { readAnswer as readStepAnswer } from '@/lib/answers';
import { latestReadings } from '@/lib/bands';
import { checkConsistency, type Contradiction } from '@/lib/consistency';
import { AppError } from '@/lib/errors';
import type { Scope } from '@/lib/policy';

/** A save's result as the handler makes it (dates still Dates); the output schema puts it on the wire. */
type AnswerResult = z.input<typeof answerResultSchema>;
import type { EnergyState, FindingStep, MeasureStep, TreeVersion } from '@/lib/trees/schema';
import type { Role } from '@/lib/roles';
import type { answerResultSchema } from '@/lib/validations/api';
import type { z } from 'zod';
import type { AnswerInput, CallStatus } from '@/lib/validations/field';
import { toApiFinding, toApiStep } from '@/lib/server/steps';
import { notify } from '@/lib/server/notify';
import {
  advance,
  currentStep,
  getStep,
  isAfterFinding,
  phaseOf,
  replayAnswers,
  startState,
  walkStateOf,
  type AutoAnswer,
  type DiagnosisAnswer,
  type DiagnosisSnapshot,
  type WalkState,
} from '@/machines/diagnosis-machine';

// The diagnosis service: the operations (route handlers and the wizard's server actions) call
// these, so a path is decided in one place — the machine compiled from the tree version. Each
// change is one transaction whose every query runs on it, locking the call (share) and then the
// diagnosis (update), always in that order.

const asMachineAnswer = (a: AnswerRecord): DiagnosisAnswer => ({
  stepId: a.stepId,
  ...(a.value !== null ? { value: a.value } : {}),
  ...(a.overRange ? { overRange: true } : {}),
  ...(a.choice !== null ? { choice: a.choice } : {}),
  ...(a.confirmed !== null ? { confirmed: a.confirmed } : {}),
});

const machineVersion = (record: TreeVersionRecord): TreeVersion => ({ id: record.id, version: record.version, graph: record.graph });

function replayOrFail(version: TreeVersion, answers: AnswerRecord[]): DiagnosisSnapshot {
  const replay = replayAnswers(version, answers.map(asMachineAnswer));
  if (!replay.ok) {
    // A saved path that no longer replays means the stored version changed, which the database forbids.
    throw new AppError('internal', `The saved answers do not replay on this tree version (${replay.error}).`);
  }
  return replay.snapshot;
}

const isClosed = (status: string) => (CLOSED_STATUSES as readonly string[]).includes(status);
const closedConflict = () => new AppError('conflict', 'This call is closed; its diagnoses cannot change.');

export function toApiAnswer(a: AnswerRecord, version?: TreeVersion) {
  const step = version ? getStep(version, a.stepId) : undefined;
  return {
    id: a.id,
    clientId: a.clientId,
    seq: a.seq,
    stepId: a.stepId,
    stepTitle: step?.title ?? a.stepId,
    kind: a.stepKind,
    text: a.text,
    value: a.value,
    unit: a.unit,
    quantity: a.quantity as AnswerResult['answer']['quantity'],
    band: a.bandLabel,
    bandIndex: a.bandIndex,
    verdict: a.verdict,
    choice: a.choice,
    choiceLabel:
      step?.kind === 'inspect'
        ? (step.choices.find((c) => c.value === a.choice)?.label ?? null)
        : step?.kind === 'fact'
          ? (step.cases.find((c) => c.value === a.choice)?.label ?? null)
          : null,
    confirmed: a.confirmed,
    overRange: a.overRange,
    auto: a.auto,
    at: a.createdAt,
  };
}

/** The energy state in the API's words: `energy` for electricity (as the first clients read it), `gas` beside it. */
export const energyOut = (e: EnergyState) => ({
  energy: e.electric === 'off' ? ('locked-out' as const) : ('energized' as const),
  gas: e.gas,
});

/** The diagnosis status a state stands for: walking, at the finding (repair to its checks), verified. */
function statusOf(version: TreeVersion, stateId: string): 'in_progress' | 'found' | 'verified' {
  if (phaseOf(version, stateId) === 'done') return 'verified';
  return isAfterFinding(version, stateId) ? 'found' : 'in_progress';
}

const findingOf = (version: TreeVersion, findingId: string | null) => {
  const step = findingId ? getStep(version, findingId) : undefined;
  return step?.kind === 'finding' ? step : null;
};

/** Stored answer rows for the unit-record branches the diagnosis took by itself. */
function autoRecords(version: TreeVersion, autos: AutoAnswer[], firstSeq: number, userId: string): AnswerRecord[] {
  return autos.map((a, i) => ({
    id: crypto.randomUUID(),
    clientId: crypto.randomUUID(),
    seq: firstSeq + i,
    stepId: a.stepId,
    stepKind: 'fact',
    text: 'From the unit record',
    value: null,
    unit: null,
    quantity: null,
    bandIndex: null,
    bandLabel: null,
    verdict: null,
    choice: a.value,
    confirmed: null,
    overRange: false,
    auto: true,
    userId,
    createdAt: new Date(),
    undoneAt: null,
    response: null,
  }));
}

/** What is stored of a unit-record branch the diagnosis took by itself. */
const autoAnswer = (r: AnswerRecord): NewAnswer => ({
  clientId: r.clientId,
  stepId: r.stepId,
  stepKind: 'fact',
  text: r.text,
  choice: r.choice,
  auto: true,
});

async function insertAutos(
  { companyId, diagnosisId, records }: { companyId: string; diagnosisId: string; records: AnswerRecord[] },
  trx: Knex,
) {
  for (const r of records) {
    await insertAnswer(
      { companyId, diagnosisId, userId: r.userId!, id: r.id, seq: r.seq, createdAt: r.createdAt, answer: autoAnswer(r), response: null },
      trx,
    );
  }
}

/**
 * The diagnosis's state from its row; a row made before the state was kept there (or by a seed)
 * gets it from one replay, stored for next time.
 */
async function stateOf(diagnosis: DiagnosisRecord, version: TreeVersion, trx: Knex): Promise<WalkState & { lastSeq: number }> {
  if (diagnosis.currentState && diagnosis.energy) {
    const step = getStep(version, diagnosis.currentState);
    return {
      stateId: diagnosis.currentState,
      energy: diagnosis.energy,
      // Past the finding (the repair, its readings and checks) the row keeps which finding it was.
      findingId: step?.kind === 'finding' ? step.id : isAfterFinding(version, diagnosis.currentState) ? diagnosis.findingStepId : null,
      lastSeq: diagnosis.lastSeq,
    };
  }
  const answers = await listPathAnswers({ companyId: diagnosis.companyId, diagnosisId: diagnosis.id }, trx);
  const state = walkStateOf(replayOrFail(version, answers));
  const lastSeq = Math.max(diagnosis.lastSeq, await maxAnswerSeq({ diagnosisId: diagnosis.id }, trx));
  await saveDiagnosisState(
    {
      companyId: diagnosis.companyId,
      id: diagnosis.id,
      status: diagnosis.status,
      findingStepId: diagnosis.findingStepId,
      currentState: state.stateId,
      energy: state.energy,
      lastSeq,
    },
    trx,
  );
  return { ...state, lastSeq };
}

export async function startDiagnosis({ scope, callId, treeVersionId }: { scope: Scope; callId: string; treeVersionId: string }) {
  return db.transaction(async (trx) => {
    const call = await getCall({ scope, id: callId, lock: 'update' }, trx);
    if (isClosed(call.status)) throw new AppError('conflict', 'This call is closed; start a new call to diagnose again.');
    const record = await getTreeVersion({ companyId: scope.companyId, id: treeVersionId, fresh: true }, trx);
    if (record.status !== 'published') {
      throw new AppError('bad_request', 'Only a published tree version can be used for a diagnosis.', {
        fieldErrors: { treeVersionId: ['Choose a published version.'] },
      });
    }
    const version = machineVersion(record);
    const unit = await getUnit({ companyId: scope.companyId, id: call.unitId }, trx);
    const { state, autos } = startState(version, unit);
    const id = await createDiagnosis(
      { companyId: scope.companyId, callId, treeVersionId, userId: scope.userId, currentState: state.stateId, energy: state.energy },
      trx,
    );
    if (autos.length > 0) {
      await insertAutos({ companyId: scope.companyId, diagnosisId: id, records: autoRecords(version, autos, 1, scope.userId) }, trx);
      await saveDiagnosisState(
        {
          companyId: scope.companyId,
          id,
          status: 'in_progress',
          findingStepId: null,
          currentState: state.stateId,
          energy: state.energy,
          lastSeq: autos.length,
        },
        trx,
      );
    }
    await setCallStatus({ companyId: scope.companyId, id: callId, status: 'diagnosing', from: ['open', 'repaired'] }, trx);
    return { id, step: toApiStep(getStep(version, state.stateId)!) };
  });
}

export async function getDiagnosisView({ scope, id }: { scope: Scope; id: string }, trx: Knex = db) {
  const call = await getCallOfDiagnosis({ scope, diagnosisId: id }, trx);
  const diagnosis = await getDiagnosis({ companyId: scope.companyId, id }, trx);
  const record = await getTreeVersion({ companyId: scope.companyId, id: diagnosis.treeVersionId }, trx);
  const version = machineVersion(record);
  const answers = await listPathAnswers({ companyId: scope.companyId, diagnosisId: id }, trx);
  const snapshot = replayOrFail(version, answers);
  const step = currentStep(snapshot);
  const stateId = walkStateOf(snapshot).stateId;
  const phase = phaseOf(version, stateId);
  const finding = findingOf(version, snapshot.context.findingId);
  const contradictions = finding
    ? await contradictionsFor(
        { companyId: scope.companyId, callId: call.id, version, finding, path: answers, verified: phase === 'done' },
        trx,
      )
    : [];
  return {
    id: diagnosis.id,
    callId: diagnosis.callId,
    status: diagnosis.status,
    treeVersionId: diagnosis.treeVersionId,
    tree: { title: record.title, version: record.version },
    startedBy: { id: diagnosis.userId, name: diagnosis.userName, role: diagnosis.userRole as Role | null },
    signedOff: diagnosis.signedOffBy ? { by: diagnosis.signedOffByName, at: diagnosis.signedOffAt } : null,
    ...energyOut(snapshot.context.energy),
    phase,
    escalation: diagnosis.escalation,
    path: answers.map((a) => toApiAnswer(a, version)),
    current: phase === 'done' || diagnosis.status === 'escalated' ? null : toApiStep(step),
    finding: finding ? toApiFinding(finding) : null,
    contradictions,
    callStatus: call.status,
  };
}

/** Readings of every diagnosis on the call (same tree version) that contradict the finding; `extra` is one not stored yet. */
async function contradictionsFor(
  {
    companyId,
    callId,
    version,
    finding,
    extra,
    path,
    verified = false,
  }: {
    companyId: string;
    callId: string;
    version: TreeVersion;
    finding: FindingStep;
    extra?: AnswerRecord;
    /** This diagnosis's path, for the readings after the repair. */
    path?: AnswerRecord[];
    /** The checks were ticked as holding: readings after the repair outside their good band contradict them. */
    verified?: boolean;
  },
  trx: Knex,
): Promise<Contradiction[]> {
  const diagnoses = (await listDiagnosesForCall({ companyId, callId }, trx)).filter((d) => d.treeVersionId === version.id);
  const answers: AnswerRecord[] = await listAnswersForDiagnoses({ companyId, diagnosisIds: diagnoses.map((d) => d.id) }, trx);
  const all = [...answers, ...(extra ? [extra] : [])];
  // Readings after the repair judge the repair, not the finding: they are left out of its check.
  const readings = all
    .filter((a) => a.value !== null && !a.stepId.startsWith('recheck--'))
    .map((a) => ({ stepId: a.stepId, value: a.value as number, quantity: a.quantity ?? undefined, takenAt: a.createdAt.toISOString() }));
  const found = checkConsistency(finding, readings);
  if (!verified) return found;
  // A verification ticked as holding while a reading after the repair lies outside its good band
  // (1.5 µA ticked as "in the good band") is flagged.
  const after = [...(path ?? []), ...(extra ? [extra] : [])].filter((a) => a.stepId.startsWith('recheck--') && a.verdict !== 'within');
  for (const a of after) {
    const step = getStep(version, a.stepId);
    const good = step?.kind === 'measure' ? step.bands.find((b) => b.verdict === 'within') : undefined;
    found.push({
      stepId: a.stepId,
      value: a.value ?? Number.POSITIVE_INFINITY,
      expected: { ...(good?.from !== undefined ? { from: good.from } : {}), ...(good?.to !== undefined ? { to: good.to } : {}) },
      reason: `The checks were ticked as holding, but this reading after the repair is ${(a.bandLabel ?? 'outside the good band').toLowerCase()}`,
      takenAt: a.createdAt.toISOString(),
    });
  }
  return found;
}

/** What an answer to `step` stores and tells the machine, or a 400 saying what is wrong with it. */
function readAnswer(version: TreeVersion, input: AnswerInput, readings: Record<string, number>) {
  const step = getStep(version, input.stepId);
  if (!step) {
    throw new AppError('bad_request', `"${input.stepId}" is not a step of this tree version.`, {
      fieldErrors: { stepId: ['Unknown step.'] },
    });
  }
  const read = readStepAnswer(step, input, readings);
  const { choiceLabel: _label, ...kept } = read.fields;
  const stored: NewAnswer = { clientId: input.clientId, stepId: step.id, stepKind: step.kind, ...kept };
  const machine: DiagnosisAnswer = { stepId: step.id, ...read.machine };
  const verdict: AnswerResult['verdict'] = read.verdict;
  return { step, stored, machine, verdict };
}

/**
 * The earlier readings an answer needs, from this diagnosis's path: those a step's bands are
 * relative to, and, from the finding on, whether the walk took the readings retaken after a repair.
 * Every other answer needs none, so the path is read only for these.
 */
async function readingsFor(
  { companyId, diagnosisId, version, stepId }: { companyId: string; diagnosisId: string; version: TreeVersion; stepId: string },
  trx: Knex,
): Promise<Record<string, number>> {
  const step = getStep(version, stepId);
  const relative = step?.kind === 'measure' && (step as MeasureStep).reference;
  const phase = phaseOf(version, stepId);
  if (!relative && (phase === 'walk' || phase === 'procedure')) return {};
  return latestReadings(await listPathAnswers({ companyId, diagnosisId }, trx));
}

const OPEN_STATUSES = ['in_progress', 'found'];

/** The answer a retried save gets: what the first one got, if it was for the same step. */
function replayedSave(earlier: { stepId: string; response: unknown }, input: AnswerInput): AnswerResult {
  if (earlier.stepId !== input.stepId) throw new AppError('conflict', 'That clientId was already used for another step.');
  return earlier.response as AnswerResult;
}

/** Why a diagnosis does not take answers, or null when it does. */
function refusal(call: { status: CallStatus }, diagnosis: DiagnosisRecord): AppError | null {
  if (isClosed(call.status)) return closedConflict();
  if (diagnosis.status === 'escalated') return new AppError('conflict', 'This diagnosis was escalated; its answers cannot change.');
  if (!OPEN_STATUSES.includes(diagnosis.status)) {
    return new AppError('conflict', 'This visit is finished: the repair is verified. Undo the last answer to change it.');
  }
  return null;
}

/**
 * Saves one answer: idempotent by the client's id, checked against the current step kept on the
 * diagnosis row, moved on by one machine transition (and the unit-record branches after it),
 * answered with what the wizard needs next.
 *
 * A save is one read and one write, and holds no transaction while the machine runs: it reads the
 * call, the diagnosis and any answer already stored under the client's id in one statement, and
 * writes in one statement (`commitSave`) that lands only if the diagnosis is still at the revision
 * it read. Of two saves at once (or a save beside an undo), one lands; the other reads again and
 * answers as a retry (the same client id) or a 409.
 */
export async function answerDiagnosis({ scope, id, input }: { scope: Scope; id: string; input: AnswerInput }): Promise<AnswerResult> {
  const { call, diagnosis, earlier } = await readForSave({ scope, diagnosisId: id, clientId: input.clientId });
  if (earlier) return replayedSave(earlier, input);
  const version = machineVersion(await getTreeVersion({ companyId: scope.companyId, id: diagnosis.treeVersionId }));
  if (!diagnosis.currentState || !diagnosis.energy) {
    // A row made before the state was kept on it: store the state once, then save as usual.
    await db.transaction(async (trx) => {
      const locked = await getDiagnosis({ companyId: scope.companyId, id, forUpdate: true }, trx);
      if (!locked.currentState || !locked.energy) await stateOf(locked, version, trx);
    });
    return answerDiagnosis({ scope, id, input });
  }

  // The answer is checked against the step it names first, so bad input is a 400 whatever the
  // diagnosis's state; only a well-formed answer to a step that is not current is a 409.
  const readings = await readingsFor({ companyId: scope.companyId, diagnosisId: id, version, stepId: input.stepId }, db);
  const { step, stored, machine, verdict } = readAnswer(version, input, readings);
  const refused = refusal(call, diagnosis);
  if (refused) throw refused;
  const state = await stateOf(diagnosis, version, db);
  if (step.id !== state.stateId) {
    const current = getStep(version, state.stateId);
    throw new AppError(
      'conflict',
      `This diagnosis is at "${current?.title ?? state.stateId}", not at "${step.title}". Reload to see where it stands.`,
    );
  }
  const moved = advance(version, state, machine, { unit: call.unit, readings });
  if (!moved.ok) throw new AppError('bad_request', moved.error);
  const status = statusOf(version, moved.state.stateId);
  const phase = phaseOf(version, moved.state.stateId);
  const finding = findingOf(version, moved.state.findingId);
  const reachedFinding = finding !== null && phase === 'repair' && step.kind !== 'finding';

  const record: AnswerRecord = {
    id: crypto.randomUUID(),
    seq: state.lastSeq + 1,
    createdAt: new Date(),
    userId: scope.userId,
    undoneAt: null,
    response: null,
    text: null,
    value: null,
    unit: null,
    quantity: null,
    bandIndex: null,
    bandLabel: null,
    verdict: null,
    choice: null,
    confirmed: null,
    overRange: false,
    auto: false,
    ...stored,
  } as AnswerRecord;
  const autos = autoRecords(version, moved.autos, record.seq + 1, scope.userId);
  const contradictions =
    finding && (reachedFinding || phase === 'done')
      ? await contradictionsFor(
          {
            companyId: scope.companyId,
            callId: call.id,
            version,
            finding,
            extra: record,
            path: phase === 'done' ? await listPathAnswers({ companyId: scope.companyId, diagnosisId: id }) : [],
            verified: phase === 'done',
          },
          db,
        )
      : [];
  const result: AnswerResult = {
    answer: toApiAnswer(record, version),
    next: phase === 'done' ? null : toApiStep(moved.step),
    finding: finding ? toApiFinding(finding) : null,
    ...(verdict ? { verdict } : {}),
    diagnosis: { status, ...energyOut(moved.state.energy), phase, contradictions },
    auto: autos.map((a) => toApiAnswer(a, version)),
  };
  const saved = await commitSave({
    companyId: scope.companyId,
    callId: call.id,
    id,
    revision: diagnosis.revision,
    status,
    findingStepId: finding?.id ?? null,
    currentState: moved.state.stateId,
    energy: moved.state.energy,
    lastSeq: record.seq + autos.length,
    rows: [
      { ...record, ...stored, userId: scope.userId, response: result },
      ...autos.map((a) => ({ ...autoAnswer(a), id: a.id, userId: scope.userId, seq: a.seq, createdAt: a.createdAt, response: null })),
    ],
    // A verified repair makes the call repaired: it can be closed.
    repaired: status === 'verified',
  });
  if (saved && reachedFinding)
    await notify({
      kind: 'sign-off',
      companyId: scope.companyId,
      actorId: scope.userId,
      callId: call.id,
      diagnosisId: id,
      findingTitle: finding.title,
    });
  if (saved) return result;

  // Something changed since the read: this very answer (a retry sent at the same time), another
  // answer or an undo, an escalation, or the call was closed.
  const now = await readForSave({ scope, diagnosisId: id, clientId: input.clientId });
  if (now.earlier) return replayedSave(now.earlier, input);
  throw (
    refusal(now.call, now.diagnosis) ??
    new AppError(
      'conflict',
      'This diagnosis changed while the answer was being saved (another answer or an undo). Reload to see where it stands.',
    )
  );
}

/**
 * Takes the last answer off the path (the row stays), with the unit-record branches taken after
 * it. With `last` (the client id of the answer the client sees as last), a second undo sent at the
 * same time is a 409 instead of undoing one more. A signed-off or escalated diagnosis keeps its
 * answers.
 */
export async function undoLastAnswer({ scope, id, last }: { scope: Scope; id: string; last?: string }) {
  return db.transaction(async (trx) => {
    const call = await getCallOfDiagnosis({ scope, diagnosisId: id, lock: 'share' }, trx);
    const diagnosis = await getDiagnosis({ companyId: scope.companyId, id, forUpdate: true }, trx);
    if (isClosed(call.status)) throw closedConflict();
    if (diagnosis.signedOffBy) throw new AppError('conflict', 'This finding was signed off; its answers cannot change.');
    if (diagnosis.status === 'escalated') throw new AppError('conflict', 'This diagnosis was escalated; its answers cannot change.');
    const version = machineVersion(await getTreeVersion({ companyId: scope.companyId, id: diagnosis.treeVersionId }, trx));
    const state = await stateOf(diagnosis, version, trx);
    const answers = await listPathAnswers({ companyId: scope.companyId, diagnosisId: id }, trx);
    // The technician's last answer, and the unit-record branches the diagnosis took after it.
    let cut = answers.length;
    while (cut > 0 && answers[cut - 1].auto) cut--;
    const undone = answers[cut - 1];
    if (!undone) throw new AppError('conflict', 'There is no answer to undo.');
    if (last && undone.clientId !== last)
      throw new AppError('conflict', 'That answer is no longer the last one: the diagnosis changed. Reload to see where it stands.');
    for (const a of answers.slice(cut - 1).reverse()) {
      if (!(await markAnswerUndone({ id: a.id }, trx))) throw new AppError('conflict', 'That answer was already undone.');
    }
    const after = walkStateOf(replayOrFail(version, answers.slice(0, cut - 1)));
    // Undoing the last check of a verified visit takes the call back to diagnosing.
    if (diagnosis.status === 'verified' && statusOf(version, after.stateId) !== 'verified') {
      await setCallStatus({ companyId: scope.companyId, id: call.id, status: 'diagnosing', from: ['repaired'] }, trx);
    }
    await saveDiagnosisState(
      {
        companyId: scope.companyId,
        id,
        status: statusOf(version, after.stateId),
        findingStepId: after.findingId,
        currentState: after.stateId,
        energy: after.energy,
        lastSeq: state.lastSeq,
        clearSignOff: true,
      },
      trx,
    );
    return getDiagnosisView({ scope, id }, trx);
  });
}

/**
 * "None of these fits" / "I can't take this reading": ends the diagnosis as escalated with the
 * technician's note, where the company's leads see it. Of two at once, one wins.
 */
export async function escalate({ scope, id, note }: { scope: Scope; id: string; note: string }) {
  return db.transaction(async (trx) => {
    const call = await getCallOfDiagnosis({ scope, diagnosisId: id, lock: 'share' }, trx);
    if (isClosed(call.status)) throw closedConflict();
    await getDiagnosis({ companyId: scope.companyId, id, forUpdate: true }, trx);
    if (!(await escalateDiagnosis({ companyId: scope.companyId, id, userId: scope.userId, note }, trx))) {
      throw new AppError('conflict', 'This diagnosis has already ended (escalated or verified).');
    }
    await notify({ kind: 'escalation', companyId: scope.companyId, actorId: scope.userId, callId: call.id, diagnosisId: id, note });
    return getDiagnosisView({ scope, id }, trx);
  });
}

/** A technician, lead or admin signs off someone else's finding; of two sign-offs at once, one wins. */
export async function signOffFinding({ scope, id, comment }: { scope: Scope; id: string; comment?: string }) {
  return db.transaction(async (trx) => {
    const call = await getCallOfDiagnosis({ scope, diagnosisId: id, lock: 'share' }, trx);
    if (isClosed(call.status)) throw closedConflict();
    const diagnosis = await getDiagnosis({ companyId: scope.companyId, id, forUpdate: true }, trx);
    if (diagnosis.status !== 'found' && diagnosis.status !== 'verified') {
      throw new AppError('conflict', 'Only a diagnosis that reached its finding can be signed off.');
    }
    if (diagnosis.userId === scope.userId) throw new AppError('forbidden', 'Someone else signs off your own finding.');
    if (!(await signOffDiagnosis({ companyId: scope.companyId, id, userId: scope.userId }, trx))) {
      throw new AppError('conflict', 'This finding was already signed off.');
    }
    await recordCallEvent(
      { companyId: scope.companyId, callId: call.id, diagnosisId: id, kind: 'signed_off', actorId: scope.userId, note: comment ?? null },
      trx,
    );
    return getDiagnosisView({ scope, id }, trx);
  });
}
