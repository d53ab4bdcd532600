import 'server-only';
import type { Knex } from 'knex';
import { getCall, setCallStatus, type Viewer } from '@/db/calls';
import {
  createDiagnosis,
  findAnswerByClientId,
  getDiagnosis,
  insertAnswer,
  listAnswersForDiagnoses,
  listDiagnosesForCall,
  listPathAnswers,
  markAnswerUndone,
  saveAnswerResponse,
  updateDiagnosisOutcome,
  type AnswerRecord,
} from '@/db/diagnoses';
import { db } from '@/db/knex';
import { getTreeVersion, type TreeVersionRecord } from '@/db/trees';
import { evaluateReading } from '@/lib/bands';
import { checkConsistency } from '@/lib/consistency';
import { AppError } from '@/lib/errors';
import { currentStep, getStep, replayAnswers, type DiagnosisAnswer, type DiagnosisSnapshot } from '@/machines/diagnosis-machine';
import { parseReading } from '@/lib/units';
import type { FindingStep, TreeVersion } from '@/lib/trees/schema';
import { toApiFinding, toApiStep } from '@/lib/server/steps';
import type { AnswerInput } from '@/lib/validations/field';

// The diagnosis service: the route handlers and the wizard's server actions both call these, so
// a path is decided in one place — the machine compiled from the tree version.

const FIELD_WRITERS = new Set(['apprentice', 'technician', 'lead', 'admin']);

function assertFieldUser(viewer: Viewer) {
  // Trainers see no real calls: answer as if the call did not exist.
  if (!FIELD_WRITERS.has(viewer.role)) throw new AppError('not_found', 'That service call was not found.');
}

const asMachineAnswer = (a: AnswerRecord): DiagnosisAnswer => ({
  stepId: a.stepId,
  ...(a.value !== null ? { value: a.value } : {}),
  ...(a.choice !== null ? { choice: a.choice } : {}),
  ...(a.confirmed !== null ? { confirmed: a.confirmed } : {}),
});

function machineVersion(record: TreeVersionRecord): TreeVersion {
  return { id: record.id, version: record.version, graph: record.graph };
}

function replayOrFail(version: TreeVersion, answers: AnswerRecord[]): DiagnosisSnapshot {
  const replay = replayAnswers(version, answers.map(asMachineAnswer));
  if (!replay.ok) {
    // A saved path that no longer replays means the stored version changed, which the database forbids.
    throw new AppError('internal', `The saved answers do not replay on this tree version (${replay.error}).`);
  }
  return replay.snapshot;
}

function findingOf(version: TreeVersion, snapshot: DiagnosisSnapshot): FindingStep | null {
  const step = currentStep(snapshot);
  return step.kind === 'finding' ? step : null;
}

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
    quantity: a.quantity,
    band: a.bandLabel,
    bandIndex: a.bandIndex,
    verdict: a.verdict,
    choice: a.choice,
    choiceLabel: step?.kind === 'inspect' ? (step.choices.find((c) => c.value === a.choice)?.label ?? null) : null,
    confirmed: a.confirmed,
    at: a.createdAt,
  };
}
export type ApiAnswer = ReturnType<typeof toApiAnswer>;

/** A diagnosis the viewer may see: its call must be visible to them. */
async function loadDiagnosis(viewer: Viewer, id: string, trx: Knex = db, forUpdate = false) {
  assertFieldUser(viewer);
  const diagnosis = await getDiagnosis({ companyId: viewer.companyId, id, forUpdate }, trx);
  const call = await getCall({ viewer, id: diagnosis.callId });
  const version = await getTreeVersion({ companyId: viewer.companyId, id: diagnosis.treeVersionId });
  return { diagnosis, call, version: machineVersion(version), record: version };
}

export async function startDiagnosis({ viewer, callId, treeVersionId }: { viewer: Viewer; callId: string; treeVersionId: string }) {
  assertFieldUser(viewer);
  const call = await getCall({ viewer, id: callId });
  if (call.status === 'closed' || call.status === 'referred')
    throw new AppError('conflict', 'This call is closed; start a new call to diagnose again.');
  const record = await getTreeVersion({ companyId: viewer.companyId, id: treeVersionId });
  if (record.status !== 'published') {
    throw new AppError('bad_request', 'Only a published tree version can be used for a diagnosis.', {
      fieldErrors: { treeVersionId: ['Choose a published version.'] },
    });
  }
  const version = machineVersion(record);
  const id = await db.transaction(async (trx) => {
    const created = await createDiagnosis({ companyId: viewer.companyId, callId, treeVersionId, userId: viewer.id }, trx);
    await setCallStatus({ viewer, id: callId, status: 'diagnosing', from: ['open', 'repaired'] }, trx);
    return created;
  });
  const snapshot = replayOrFail(version, []);
  return { id, step: toApiStep(currentStep(snapshot)) };
}

export async function getDiagnosisView({ viewer, id }: { viewer: Viewer; id: string }) {
  const { diagnosis, call, version, record } = await loadDiagnosis(viewer, id);
  const answers = await listPathAnswers({ companyId: viewer.companyId, diagnosisId: id });
  const snapshot = replayOrFail(version, answers);
  const finding = findingOf(version, snapshot);
  const contradictions = finding ? await contradictionsFor({ viewer, callId: call.id, treeVersionId: version.id, finding }) : [];
  return {
    id: diagnosis.id,
    callId: diagnosis.callId,
    status: diagnosis.status,
    treeVersionId: diagnosis.treeVersionId,
    tree: { title: record.title, version: record.version },
    startedBy: { id: diagnosis.userId, name: diagnosis.userName, role: diagnosis.userRole },
    signedOff: diagnosis.signedOffBy ? { by: diagnosis.signedOffByName, at: diagnosis.signedOffAt } : null,
    energy: snapshot.context.energy,
    path: answers.map((a) => toApiAnswer(a, version)),
    current: finding ? null : toApiStep(currentStep(snapshot)),
    finding: finding ? toApiFinding(finding) : null,
    contradictions,
    callStatus: call.status,
  };
}
export type DiagnosisView = Awaited<ReturnType<typeof getDiagnosisView>>;

/** Readings of every diagnosis on the call (same tree version) that contradict the finding. */
async function contradictionsFor({
  viewer,
  callId,
  treeVersionId,
  finding,
}: {
  viewer: Viewer;
  callId: string;
  treeVersionId: string;
  finding: FindingStep;
}) {
  const diagnoses = (await listDiagnosesForCall({ companyId: viewer.companyId, callId })).filter((d) => d.treeVersionId === treeVersionId);
  const answers = await listAnswersForDiagnoses({ companyId: viewer.companyId, diagnosisIds: diagnoses.map((d) => d.id) });
  const readings = answers
    .filter((a) => a.value !== null)
    .map((a) => ({ stepId: a.stepId, value: a.value as number, quantity: a.quantity ?? undefined, takenAt: a.createdAt.toISOString() }));
  return checkConsistency(finding, readings);
}

export async function answerDiagnosis({ viewer, id, input }: { viewer: Viewer; id: string; input: AnswerInput }) {
  return db.transaction(async (trx) => {
    const { diagnosis, call, version } = await loadDiagnosis(viewer, id, trx, true);
    // A retried save: send back what the first one got, store nothing new.
    const earlier = await findAnswerByClientId({ companyId: viewer.companyId, diagnosisId: id, clientId: input.clientId }, trx);
    if (earlier) {
      if (earlier.stepId !== input.stepId) throw new AppError('conflict', 'That clientId was already used for another step.');
      return earlier.response as AnswerResult;
    }
    // The answer is checked against the step it names first, so bad input is a 400 whatever the
    // diagnosis's state; only a well-formed answer to a step that is not current is a 409.
    const step = getStep(version, input.stepId);
    if (!step) {
      throw new AppError('bad_request', `"${input.stepId}" is not a step of this tree version.`, {
        fieldErrors: { stepId: ['Unknown step.'] },
      });
    }
    const stored: Parameters<typeof insertAnswer>[0]['answer'] = { clientId: input.clientId, stepId: step.id, stepKind: step.kind };
    const machineAnswer: DiagnosisAnswer = { stepId: step.id };
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
      machineAnswer.value = parsed.value;
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
      machineAnswer.choice = choice.value;
    } else if (step.kind === 'action') {
      if (input.confirmed !== true)
        throw new AppError('bad_request', 'Confirm the step once it is done.', { fieldErrors: { confirmed: ['Confirm the step.'] } });
      stored.confirmed = true;
      machineAnswer.confirmed = true;
    } else {
      throw new AppError('conflict', 'A finding is where a diagnosis ends; it takes no answer.');
    }

    if (call.status === 'closed' || call.status === 'referred')
      throw new AppError('conflict', 'This call is closed; its diagnoses cannot change.');
    if (diagnosis.status !== 'in_progress') throw new AppError('conflict', 'This diagnosis has ended. Undo the last answer to change it.');
    const answers = await listPathAnswers({ companyId: viewer.companyId, diagnosisId: id }, trx);
    const current = currentStep(replayOrFail(version, answers));
    if (step.id !== current.id) {
      throw new AppError('conflict', `This diagnosis is at "${current.title}", not at "${step.title}". Reload to see where it stands.`);
    }

    const replay = replayAnswers(version, [...answers.map(asMachineAnswer), machineAnswer]);
    if (!replay.ok) throw new AppError('bad_request', replay.error);
    const nextStep = currentStep(replay.snapshot);
    const finding = nextStep.kind === 'finding' ? nextStep : null;

    const answer = await insertAnswer({ companyId: viewer.companyId, diagnosisId: id, userId: viewer.id, answer: stored }, trx);
    if (finding) await updateDiagnosisOutcome({ companyId: viewer.companyId, id, status: 'found', findingStepId: finding.id }, trx);
    const result: AnswerResult = {
      answer: toApiAnswer(answer, version),
      next: finding ? null : toApiStep(nextStep),
      finding: finding ? toApiFinding(finding) : null,
      ...(verdict ? { verdict } : {}),
    };
    await saveAnswerResponse({ id: answer.id, response: result }, trx);
    return result;
  });
}

export interface AnswerResult {
  answer: ApiAnswer;
  next: ReturnType<typeof toApiStep> | null;
  finding: ReturnType<typeof toApiFinding> | null;
  verdict?: { band: string; outcome: string; position: number; verdict: string; value: number };
}

export async function undoLastAnswer({ viewer, id }: { viewer: Viewer; id: string }) {
  await db.transaction(async (trx) => {
    const { call } = await loadDiagnosis(viewer, id, trx, true);
    if (call.status === 'closed' || call.status === 'referred')
      throw new AppError('conflict', 'This call is closed; its diagnoses cannot change.');
    const answers = await listPathAnswers({ companyId: viewer.companyId, diagnosisId: id }, trx);
    const last = answers.at(-1);
    if (!last) throw new AppError('conflict', 'There is no answer to undo.');
    await markAnswerUndone({ id: last.id }, trx);
    await updateDiagnosisOutcome({ companyId: viewer.companyId, id, status: 'in_progress', findingStepId: null }, trx);
    await trx('diagnoses').where({ id }).update({ signed_off_by: null, signed_off_at: null });
  });
  return getDiagnosisView({ viewer, id });
}
