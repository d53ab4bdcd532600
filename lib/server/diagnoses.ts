import 'server-only';
import type { Knex } from 'knex';
import { CLOSED_STATUSES, getCall, setCallStatus } from '@/db/calls';
import {
  createDiagnosis,
  findAnswerByClientId,
  getCallOfDiagnosis,
  getDiagnosis,
  insertAnswer,
  listAnswersForDiagnoses,
  listDiagnosesForCall,
  listPathAnswers,
  markAnswerUndone,
  maxAnswerSeq,
  saveDiagnosisState,
  signOffDiagnosis,
  type AnswerRecord,
  type DiagnosisRecord,
  type NewAnswer,
} from '@/db/diagnoses';
import { db } from '@/db/knex';
import { getTreeVersion, type TreeVersionRecord } from '@/db/trees';
import { evaluateReading } from '@/lib/bands';
import { checkConsistency, type Contradiction } from '@/lib/consistency';
import { AppError } from '@/lib/errors';
import type { Scope } from '@/lib/policy';

/** A save's result as the handler makes it (dates still Dates); the output schema puts it on the wire. */
type AnswerResult = z.input<typeof answerResultSchema>;
import type { FindingStep, TreeVersion } from '@/lib/trees/schema';
import { parseReading } from '@/lib/units';
import type { Role } from '@/lib/roles';
import type { answerResultSchema } from '@/lib/validations/api';
import type { z } from 'zod';
import type { AnswerInput } from '@/lib/validations/field';
import { toApiFinding, toApiStep } from '@/lib/server/steps';
import {
  advance,
  currentStep,
  getStep,
  replayAnswers,
  startState,
  walkStateOf,
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
    choiceLabel: step?.kind === 'inspect' ? (step.choices.find((c) => c.value === a.choice)?.label ?? null) : null,
    confirmed: a.confirmed,
    at: a.createdAt,
  };
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
      findingId: step?.kind === 'finding' ? step.id : null,
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
    const state = startState(version);
    const id = await createDiagnosis(
      { companyId: scope.companyId, callId, treeVersionId, userId: scope.userId, currentState: state.stateId, energy: state.energy },
      trx,
    );
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
  const finding = step.kind === 'finding' ? step : null;
  const contradictions = finding
    ? await contradictionsFor({ companyId: scope.companyId, callId: call.id, treeVersionId: version.id, finding }, trx)
    : [];
  return {
    id: diagnosis.id,
    callId: diagnosis.callId,
    status: diagnosis.status,
    treeVersionId: diagnosis.treeVersionId,
    tree: { title: record.title, version: record.version },
    startedBy: { id: diagnosis.userId, name: diagnosis.userName, role: diagnosis.userRole as Role | null },
    signedOff: diagnosis.signedOffBy ? { by: diagnosis.signedOffByName, at: diagnosis.signedOffAt } : null,
    energy: snapshot.context.energy,
    path: answers.map((a) => toApiAnswer(a, version)),
    current: finding ? null : toApiStep(step),
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
    treeVersionId,
    finding,
    extra,
  }: { companyId: string; callId: string; treeVersionId: string; finding: FindingStep; extra?: AnswerRecord },
  trx: Knex,
): Promise<Contradiction[]> {
  const diagnoses = (await listDiagnosesForCall({ companyId, callId }, trx)).filter((d) => d.treeVersionId === treeVersionId);
  const answers: AnswerRecord[] = await listAnswersForDiagnoses({ companyId, diagnosisIds: diagnoses.map((d) => d.id) }, trx);
  const readings = [...answers, ...(extra ? [extra] : [])]
    .filter((a) => a.value !== null)
    .map((a) => ({ stepId: a.stepId, value: a.value as number, quantity: a.quantity ?? undefined, takenAt: a.createdAt.toISOString() }));
  return checkConsistency(finding, readings);
}

/** What an answer to `step` stores and tells the machine, or a 400 saying what is wrong with it. */
function readAnswer(version: TreeVersion, input: AnswerInput) {
  const step = getStep(version, input.stepId);
  if (!step) {
    throw new AppError('bad_request', `"${input.stepId}" is not a step of this tree version.`, {
      fieldErrors: { stepId: ['Unknown step.'] },
    });
  }
  const stored: NewAnswer = { clientId: input.clientId, stepId: step.id, stepKind: step.kind };
  const machine: DiagnosisAnswer = { stepId: step.id };
  let verdict: AnswerResult['verdict'];
  if (step.kind === 'measure') {
    const parsed = parseReading(step.quantity, input.text ?? '', input.unit);
    if (!parsed.ok) throw new AppError('bad_request', parsed.message, { fieldErrors: { text: [parsed.message] } });
    const evaluation = evaluateReading(step, parsed.value);
    Object.assign(stored, {
      text: input.text,
      value: parsed.value,
      unit: parsed.unit,
      quantity: step.quantity,
      bandIndex: evaluation.index,
      bandLabel: evaluation.band.label,
      verdict: evaluation.verdict,
    });
    machine.value = parsed.value;
    verdict = {
      band: evaluation.band.label,
      outcome: evaluation.outcome,
      position: evaluation.position,
      verdict: evaluation.verdict,
      value: parsed.value,
    };
  } else if (step.kind === 'inspect') {
    const choice = step.choices.find((c) => c.value === input.choice);
    if (!choice) {
      const message = `Choose one of: ${step.choices.map((c) => c.value).join(', ')}.`;
      throw new AppError('bad_request', message, { fieldErrors: { choice: [message] } });
    }
    stored.choice = choice.value;
    machine.choice = choice.value;
  } else if (step.kind === 'action') {
    if (input.confirmed !== true) {
      throw new AppError('bad_request', 'Confirm the step once it is done.', { fieldErrors: { confirmed: ['Confirm the step.'] } });
    }
    stored.confirmed = true;
    machine.confirmed = true;
  } else {
    throw new AppError('conflict', 'A finding is where a diagnosis ends; it takes no answer.');
  }
  return { step, stored, machine, verdict };
}

/**
 * Saves one answer: idempotent by the client's id, checked against the current step kept on the
 * diagnosis row, moved on by one machine transition, answered with what the wizard needs next.
 */
export async function answerDiagnosis({ scope, id, input }: { scope: Scope; id: string; input: AnswerInput }): Promise<AnswerResult> {
  return db.transaction(async (trx) => {
    const call = await getCallOfDiagnosis({ scope, diagnosisId: id, lock: 'share' }, trx);
    const diagnosis = await getDiagnosis({ companyId: scope.companyId, id, forUpdate: true }, trx);
    const version = machineVersion(await getTreeVersion({ companyId: scope.companyId, id: diagnosis.treeVersionId }, trx));

    // A retried save: send back what the first one got, store nothing new.
    const earlier = await findAnswerByClientId({ companyId: scope.companyId, diagnosisId: id, clientId: input.clientId }, trx);
    if (earlier) {
      if (earlier.stepId !== input.stepId) throw new AppError('conflict', 'That clientId was already used for another step.');
      return earlier.response as AnswerResult;
    }

    // The answer is checked against the step it names first, so bad input is a 400 whatever the
    // diagnosis's state; only a well-formed answer to a step that is not current is a 409.
    const { step, stored, machine, verdict } = readAnswer(version, input);
    if (isClosed(call.status)) throw closedConflict();
    if (diagnosis.status !== 'in_progress') throw new AppError('conflict', 'This diagnosis has ended. Undo the last answer to change it.');
    const state = await stateOf(diagnosis, version, trx);
    if (step.id !== state.stateId) {
      const current = getStep(version, state.stateId);
      throw new AppError(
        'conflict',
        `This diagnosis is at "${current?.title ?? state.stateId}", not at "${step.title}". Reload to see where it stands.`,
      );
    }
    const moved = advance(version, state, machine);
    if (!moved.ok) throw new AppError('bad_request', moved.error);
    const finding = moved.step.kind === 'finding' ? moved.step : null;

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
      ...stored,
    } as AnswerRecord;
    const contradictions = finding
      ? await contradictionsFor({ companyId: scope.companyId, callId: call.id, treeVersionId: version.id, finding, extra: record }, trx)
      : [];
    const status = finding ? 'found' : 'in_progress';
    const result: AnswerResult = {
      answer: toApiAnswer(record, version),
      next: finding ? null : toApiStep(moved.step),
      finding: finding ? toApiFinding(finding) : null,
      ...(verdict ? { verdict } : {}),
      diagnosis: { status, energy: moved.state.energy, contradictions },
    };
    await insertAnswer(
      {
        companyId: scope.companyId,
        diagnosisId: id,
        userId: scope.userId,
        id: record.id,
        seq: record.seq,
        createdAt: record.createdAt,
        answer: stored,
        response: result,
      },
      trx,
    );
    await saveDiagnosisState(
      {
        companyId: scope.companyId,
        id,
        status,
        findingStepId: finding?.id ?? null,
        currentState: moved.state.stateId,
        energy: moved.state.energy,
        lastSeq: record.seq,
      },
      trx,
    );
    return result;
  });
}

/**
 * Takes the last answer off the path (the row stays). With `last` (the client id of the answer the
 * client sees as last), a second undo sent at the same time is a 409 instead of undoing one more.
 */
export async function undoLastAnswer({ scope, id, last }: { scope: Scope; id: string; last?: string }) {
  return db.transaction(async (trx) => {
    const call = await getCallOfDiagnosis({ scope, diagnosisId: id, lock: 'share' }, trx);
    const diagnosis = await getDiagnosis({ companyId: scope.companyId, id, forUpdate: true }, trx);
    if (isClosed(call.status)) throw closedConflict();
    const version = machineVersion(await getTreeVersion({ companyId: scope.companyId, id: diagnosis.treeVersionId }, trx));
    const state = await stateOf(diagnosis, version, trx);
    const answers = await listPathAnswers({ companyId: scope.companyId, diagnosisId: id }, trx);
    const undone = answers.at(-1);
    if (!undone) throw new AppError('conflict', 'There is no answer to undo.');
    if (last && undone.clientId !== last)
      throw new AppError('conflict', 'That answer is no longer the last one: the diagnosis changed. Reload to see where it stands.');
    if (!(await markAnswerUndone({ id: undone.id }, trx))) throw new AppError('conflict', 'That answer was already undone.');
    const after = walkStateOf(replayOrFail(version, answers.slice(0, -1)));
    await saveDiagnosisState(
      {
        companyId: scope.companyId,
        id,
        status: 'in_progress',
        findingStepId: null,
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

/** A technician, lead or admin signs off someone else's finding; of two sign-offs at once, one wins. */
export async function signOffFinding({ scope, id }: { scope: Scope; id: string }) {
  return db.transaction(async (trx) => {
    const call = await getCallOfDiagnosis({ scope, diagnosisId: id, lock: 'share' }, trx);
    if (isClosed(call.status)) throw closedConflict();
    const diagnosis = await getDiagnosis({ companyId: scope.companyId, id, forUpdate: true }, trx);
    if (diagnosis.status !== 'found') throw new AppError('conflict', 'Only a diagnosis that reached its finding can be signed off.');
    if (diagnosis.userId === scope.userId) throw new AppError('forbidden', 'Someone else signs off your own finding.');
    if (!(await signOffDiagnosis({ companyId: scope.companyId, id, userId: scope.userId }, trx))) {
      throw new AppError('conflict', 'This finding was already signed off.');
    }
    return getDiagnosisView({ scope, id }, trx);
  });
}
