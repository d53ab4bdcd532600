import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/knex';
import { isUuid } from '@/db/users';
import { notFound } from '@/lib/errors';
import type { Scope } from '@/lib/policy';
import type { EnergyState, UnitFacts } from '@/lib/trees/schema';
import type { CallStatus } from '@/lib/validations/field';
import { scopeCalls } from '@/db/calls';

export type DiagnosisStatus = 'in_progress' | 'found' | 'verified' | 'escalated';

export interface DiagnosisRecord {
  id: string;
  companyId: string;
  callId: string;
  treeVersionId: string;
  userId: string | null;
  userName: string | null;
  userRole: string | null;
  status: DiagnosisStatus;
  findingStepId: string | null;
  signedOffBy: string | null;
  signedOffByName: string | null;
  signedOffAt: Date | null;
  startedAt: Date;
  finishedAt: Date | null;
  /** The machine's state id; null until first read after it was added (see migration 0400). */
  currentState: string | null;
  energy: EnergyState | null;
  lastSeq: number;
  escalation: { note: string; by: string | null; at: Date | null } | null;
}

export interface AnswerRecord {
  id: string;
  clientId: string;
  seq: number;
  stepId: string;
  stepKind: string;
  text: string | null;
  value: number | null;
  unit: string | null;
  quantity: string | null;
  bandIndex: number | null;
  bandLabel: string | null;
  verdict: string | null;
  choice: string | null;
  confirmed: boolean | null;
  overRange: boolean;
  auto: boolean;
  userId: string | null;
  createdAt: Date;
  undoneAt: Date | null;
  response: unknown;
}

const toDiagnosis = (r: Record<string, unknown>): DiagnosisRecord => ({
  id: r.id as string,
  companyId: r.company_id as string,
  callId: r.call_id as string,
  treeVersionId: r.tree_version_id as string,
  userId: (r.user_id as string | null) ?? null,
  userName: (r.user_name as string | null) ?? null,
  userRole: (r.user_role as string | null) ?? null,
  status: r.status as DiagnosisStatus,
  findingStepId: (r.finding_step_id as string | null) ?? null,
  signedOffBy: (r.signed_off_by as string | null) ?? null,
  signedOffByName: (r.signed_off_by_name as string | null) ?? null,
  signedOffAt: (r.signed_off_at as Date | null) ?? null,
  startedAt: r.started_at as Date,
  finishedAt: (r.finished_at as Date | null) ?? null,
  currentState: (r.current_state as string | null) ?? null,
  energy: r.energy ? { electric: r.energy === 'locked-out' ? 'off' : 'on', gas: r.gas === 'off' ? 'off' : 'on' } : null,
  lastSeq: (r.last_seq as number) ?? 0,
  escalation:
    r.escalation_note != null
      ? {
          note: r.escalation_note as string,
          by: (r.escalated_by_name as string | null) ?? null,
          at: (r.escalated_at as Date | null) ?? null,
        }
      : null,
});

/** The columns of an energy state: `energy` (electricity, in the first revision's words) and `gas`. */
const energyColumns = (energy: EnergyState) => ({ energy: energy.electric === 'off' ? 'locked-out' : 'energized', gas: energy.gas });

const toAnswer = (r: Record<string, unknown>): AnswerRecord => ({
  id: r.id as string,
  clientId: r.client_id as string,
  seq: r.seq as number,
  stepId: r.step_id as string,
  stepKind: r.step_kind as string,
  text: (r.text as string | null) ?? null,
  value: (r.value as number | null) ?? null,
  unit: (r.unit as string | null) ?? null,
  quantity: (r.quantity as string | null) ?? null,
  bandIndex: (r.band_index as number | null) ?? null,
  bandLabel: (r.band_label as string | null) ?? null,
  verdict: (r.verdict as string | null) ?? null,
  choice: (r.choice as string | null) ?? null,
  confirmed: (r.confirmed as boolean | null) ?? null,
  overRange: r.over_range === true,
  auto: r.auto === true,
  userId: (r.user_id as string | null) ?? null,
  createdAt: r.created_at as Date,
  undoneAt: (r.undone_at as Date | null) ?? null,
  response: r.response ?? null,
});

const diagnosisQuery = (trx: Knex) =>
  trx('diagnoses as d')
    .leftJoin('users as u', 'u.id', 'd.user_id')
    .leftJoin('users as so', 'so.id', 'd.signed_off_by')
    .leftJoin('users as esc', 'esc.id', 'd.escalated_by')
    .select('d.*', 'u.name as user_name', 'u.role as user_role', 'so.name as signed_off_by_name', 'esc.name as escalated_by_name');

/**
 * The call of a diagnosis, if the scope reaches it, with the call's row lock when asked: the first
 * statement of every unit of work that changes a diagnosis (locks are taken call, then diagnosis).
 */
export async function getCallOfDiagnosis(
  { scope, diagnosisId, lock }: { scope: Scope; diagnosisId: string; lock?: 'share' | 'update' },
  trx: Knex = db,
): Promise<{ id: string; status: CallStatus; technicianId: string | null; unit: UnitFacts }> {
  if (!isUuid(diagnosisId)) throw notFound('That diagnosis');
  const q = scopeCalls(
    trx('service_calls as c').join('diagnoses as d', 'd.call_id', 'c.id').join('units as un', 'un.id', 'c.unit_id'),
    scope,
  )
    .where({ 'd.id': diagnosisId, 'd.company_id': scope.companyId })
    .select('c.id', 'c.status', 'c.technician_id', 'un.ignition', 'un.fuel', 'un.control_supply', 'un.draft');
  if (lock === 'share') q.forShare('c');
  if (lock === 'update') q.forUpdate('c');
  const row = await q.first();
  if (!row) throw notFound('That diagnosis');
  return {
    id: row.id,
    status: row.status,
    technicianId: row.technician_id ?? null,
    unit: { ignition: row.ignition, fuel: row.fuel, controlSupply: row.control_supply, draft: row.draft ?? 'induced' },
  };
}

/** Company scope only: the caller has checked (getCallOfDiagnosis) that the scope reaches its call. */
export async function getDiagnosis(
  { companyId, id, forUpdate = false }: { companyId: string; id: string; forUpdate?: boolean },
  trx: Knex = db,
): Promise<DiagnosisRecord> {
  if (!isUuid(id)) throw notFound('That diagnosis');
  const q = diagnosisQuery(trx).where({ 'd.id': id, 'd.company_id': companyId });
  if (forUpdate) q.forUpdate('d');
  const row = await q.first();
  if (!row) throw notFound('That diagnosis');
  return toDiagnosis(row);
}

export async function listDiagnosesForCall(
  { companyId, callId }: { companyId: string; callId: string },
  trx: Knex = db,
): Promise<DiagnosisRecord[]> {
  return (await diagnosisQuery(trx).where({ 'd.company_id': companyId, 'd.call_id': callId }).orderBy('d.started_at')).map(toDiagnosis);
}

export async function createDiagnosis(
  {
    companyId,
    callId,
    treeVersionId,
    userId,
    currentState,
    energy,
  }: { companyId: string; callId: string; treeVersionId: string; userId: string; currentState: string; energy: EnergyState },
  trx: Knex = db,
): Promise<string> {
  const [row] = await trx('diagnoses')
    .insert({
      company_id: companyId,
      call_id: callId,
      tree_version_id: treeVersionId,
      user_id: userId,
      current_state: currentState,
      ...energyColumns(energy),
    })
    .returning('id');
  return row.id;
}

/** Where the diagnosis stands after an answer or an undo (or after a replay filled in an older row). */
export async function saveDiagnosisState(
  {
    companyId,
    id,
    status,
    findingStepId,
    currentState,
    energy,
    lastSeq,
    clearSignOff = false,
  }: {
    companyId: string;
    id: string;
    status: DiagnosisStatus;
    findingStepId: string | null;
    currentState: string;
    energy: EnergyState;
    lastSeq: number;
    clearSignOff?: boolean;
  },
  trx: Knex = db,
): Promise<void> {
  await trx('diagnoses')
    .where({ id, company_id: companyId })
    .update({
      status,
      finding_step_id: findingStepId,
      finished_at: status === 'in_progress' || status === 'found' ? null : trx.fn.now(),
      current_state: currentState,
      ...energyColumns(energy),
      last_seq: lastSeq,
      ...(clearSignOff ? { signed_off_by: null, signed_off_at: null } : {}),
    });
}

/** Signs off a finding not yet signed off; of several at once, exactly one does. */
export async function signOffDiagnosis(
  { companyId, id, userId }: { companyId: string; id: string; userId: string },
  trx: Knex = db,
): Promise<boolean> {
  const count = await trx('diagnoses')
    .where({ id, company_id: companyId })
    .whereIn('status', ['found', 'verified'])
    .whereNull('signed_off_by')
    .update({ signed_off_by: userId, signed_off_at: trx.fn.now() });
  return count > 0;
}

/** The answers on the path (not undone), in order. */
export async function listPathAnswers(
  { companyId, diagnosisId }: { companyId: string; diagnosisId: string },
  trx: Knex = db,
): Promise<AnswerRecord[]> {
  return (await trx('answers').where({ company_id: companyId, diagnosis_id: diagnosisId }).whereNull('undone_at').orderBy('seq')).map(
    toAnswer,
  );
}

export async function listAnswersForDiagnoses(
  { companyId, diagnosisIds }: { companyId: string; diagnosisIds: string[] },
  trx: Knex = db,
): Promise<(AnswerRecord & { diagnosisId: string })[]> {
  if (!diagnosisIds.length) return [];
  const rows = await trx('answers')
    .where('company_id', companyId)
    .whereIn('diagnosis_id', diagnosisIds)
    .whereNull('undone_at')
    .orderBy(['diagnosis_id', 'seq']);
  return rows.map((r: Record<string, unknown>) => ({ ...toAnswer(r), diagnosisId: r.diagnosis_id as string }));
}

/** The highest sequence number given on the diagnosis, undone answers included. */
export async function maxAnswerSeq({ diagnosisId }: { diagnosisId: string }, trx: Knex = db): Promise<number> {
  const row = await trx('answers').where({ diagnosis_id: diagnosisId }).max('seq as max').first();
  return Number(row?.max ?? 0);
}

export async function findAnswerByClientId(
  { companyId, diagnosisId, clientId }: { companyId: string; diagnosisId: string; clientId: string },
  trx: Knex = db,
): Promise<AnswerRecord | null> {
  const row = await trx('answers').where({ company_id: companyId, diagnosis_id: diagnosisId, client_id: clientId }).first();
  return row ? toAnswer(row) : null;
}

export interface NewAnswer {
  clientId: string;
  stepId: string;
  stepKind: string;
  text?: string | null;
  value?: number | null;
  unit?: string | null;
  quantity?: string | null;
  bandIndex?: number | null;
  bandLabel?: string | null;
  verdict?: string | null;
  choice?: string | null;
  confirmed?: boolean | null;
  overRange?: boolean;
  auto?: boolean;
}

/**
 * Stores one answer. The caller holds the diagnosis's row lock and gives the answer its id, its
 * sequence number (the diagnosis's last_seq + 1) and the response a retried save gets back, so the
 * save is one insert.
 */
export async function insertAnswer(
  {
    companyId,
    diagnosisId,
    userId,
    id,
    seq,
    createdAt,
    answer,
    response,
  }: {
    companyId: string;
    diagnosisId: string;
    userId: string;
    id: string;
    seq: number;
    createdAt: Date;
    answer: NewAnswer;
    response: unknown;
  },
  trx: Knex = db,
): Promise<void> {
  await trx('answers').insert({
    id,
    company_id: companyId,
    diagnosis_id: diagnosisId,
    user_id: userId,
    seq,
    created_at: createdAt,
    client_id: answer.clientId,
    step_id: answer.stepId,
    step_kind: answer.stepKind,
    text: answer.text ?? null,
    value: answer.value ?? null,
    unit: answer.unit ?? null,
    quantity: answer.quantity ?? null,
    band_index: answer.bandIndex ?? null,
    band_label: answer.bandLabel ?? null,
    verdict: answer.verdict ?? null,
    choice: answer.choice ?? null,
    confirmed: answer.confirmed ?? null,
    over_range: answer.overRange ?? false,
    auto: answer.auto ?? false,
    response: JSON.stringify(response),
  });
}

/** Ends a diagnosis as escalated with the technician's note; only one still in progress (or at its finding). */
export async function escalateDiagnosis(
  { companyId, id, userId, note }: { companyId: string; id: string; userId: string; note: string },
  trx: Knex = db,
): Promise<boolean> {
  const count = await trx('diagnoses')
    .where({ id, company_id: companyId })
    .whereIn('status', ['in_progress', 'found'])
    .update({ status: 'escalated', escalation_note: note, escalated_by: userId, escalated_at: trx.fn.now(), finished_at: trx.fn.now() });
  return count > 0;
}

/** Escalated diagnoses of the company not yet closed with their call, newest first: what the leads look at. */
export async function listEscalations({ companyId, limit = 20 }: { companyId: string; limit?: number }, trx: Knex = db) {
  const rows = await trx('diagnoses as d')
    .join('service_calls as c', 'c.id', 'd.call_id')
    .join('units as un', 'un.id', 'c.unit_id')
    .join('sites as s', 's.id', 'un.site_id')
    .leftJoin('users as esc', 'esc.id', 'd.escalated_by')
    .where({ 'd.company_id': companyId, 'd.status': 'escalated' })
    .whereNotIn('c.status', ['closed'])
    .orderBy('d.escalated_at', 'desc')
    .limit(limit)
    .select(
      'd.id',
      'd.call_id',
      'd.escalation_note',
      'd.escalated_at',
      'esc.name as escalated_by_name',
      'un.label as unit_label',
      's.name as site_name',
    );
  return rows.map((r: Record<string, unknown>) => ({
    diagnosisId: r.id as string,
    callId: r.call_id as string,
    note: r.escalation_note as string,
    at: r.escalated_at as Date,
    by: (r.escalated_by_name as string | null) ?? null,
    unit: r.unit_label as string,
    site: r.site_name as string,
  }));
}

/** Takes the answer off the path if it still is on it; says whether it did (one of two undos at once). */
export async function markAnswerUndone({ id }: { id: string }, trx: Knex = db): Promise<boolean> {
  const count = await trx('answers').where({ id }).whereNull('undone_at').update({ undone_at: trx.fn.now() });
  return count > 0;
}
