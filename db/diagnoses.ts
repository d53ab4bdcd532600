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
  /** Raised by every change of the state; a save writes only at the revision it read. */
  revision: number;
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
  revision: (r.revision as number) ?? 0,
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
      revision: trx.raw('revision + 1'),
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

/** What a save reads, in one statement and without a lock: the call, the diagnosis, and an answer already stored under the client's id. */
export interface SaveContext {
  call: { id: string; status: CallStatus; unit: UnitFacts };
  /** The diagnosis row (without the names of the people on it). */
  diagnosis: DiagnosisRecord;
  /** The answer stored earlier under this client id (a retried save), with what it answered. */
  earlier: { stepId: string; response: unknown } | null;
}

export async function readForSave(
  { scope, diagnosisId, clientId }: { scope: Scope; diagnosisId: string; clientId: string },
  trx: Knex = db,
): Promise<SaveContext> {
  if (!isUuid(diagnosisId)) throw notFound('That diagnosis');
  const row = await scopeCalls(
    trx('diagnoses as d')
      .join('service_calls as c', 'c.id', 'd.call_id')
      .join('units as un', 'un.id', 'c.unit_id')
      .leftJoin('answers as e', function () {
        this.on('e.diagnosis_id', 'd.id').andOnVal('e.client_id', clientId);
      }),
    scope,
  )
    .where({ 'd.id': diagnosisId, 'd.company_id': scope.companyId })
    .select(
      'd.*',
      'c.status as call_status',
      'un.ignition',
      'un.fuel',
      'un.control_supply',
      'un.draft',
      'e.step_id as earlier_step_id',
      'e.response as earlier_response',
    )
    .first();
  if (!row) throw notFound('That diagnosis');
  return {
    call: {
      id: row.call_id,
      status: row.call_status,
      unit: { ignition: row.ignition, fuel: row.fuel, controlSupply: row.control_supply, draft: row.draft ?? 'induced' },
    },
    diagnosis: toDiagnosis(row),
    earlier: row.earlier_step_id ? { stepId: row.earlier_step_id, response: row.earlier_response } : null,
  };
}

/** A row of `answers` as a save writes it. */
export interface AnswerRow extends NewAnswer {
  id: string;
  userId: string;
  seq: number;
  createdAt: Date;
  response: unknown;
}

const ANSWER_COLUMNS = [
  'id',
  'company_id',
  'diagnosis_id',
  'user_id',
  'seq',
  'created_at',
  'client_id',
  'step_id',
  'step_kind',
  'text',
  'value',
  'unit',
  'quantity',
  'band_index',
  'band_label',
  'verdict',
  'choice',
  'confirmed',
  'over_range',
  'auto',
  'response',
].join(', ');

// One statement: the call's row share-locked if it is still open (so a close waits for it, and
// locks go call, then diagnosis, as in every other unit of work), the diagnosis moved on only if it
// is still at the revision the save read and still open, the answers inserted and the call marked
// repaired only if it was. Atomic on its own: no transaction is held while the machine runs.
const COMMIT_SAVE = `
WITH c AS (
  SELECT id FROM service_calls
  WHERE id = :callId AND company_id = :companyId AND status NOT IN ('closed', 'referred')
  FOR SHARE
), d AS (
  UPDATE diagnoses SET
    status = :status,
    finding_step_id = :findingStepId,
    finished_at = CASE WHEN :status IN ('in_progress', 'found') THEN NULL ELSE now() END,
    current_state = :currentState,
    energy = :energy,
    gas = :gas,
    last_seq = :lastSeq,
    revision = revision + 1
  WHERE id = :id AND company_id = :companyId AND revision = :revision
    AND status IN ('in_progress', 'found') AND EXISTS (SELECT 1 FROM c)
  RETURNING id
), a AS (
  INSERT INTO answers (${ANSWER_COLUMNS})
  SELECT ${ANSWER_COLUMNS} FROM jsonb_populate_recordset(CAST(NULL AS answers), CAST(:rows AS jsonb))
  WHERE EXISTS (SELECT 1 FROM d)
  RETURNING id
), r AS (
  UPDATE service_calls SET status = 'repaired'
  WHERE id = :callId AND :repaired AND status IN ('open', 'diagnosing') AND EXISTS (SELECT 1 FROM d)
  RETURNING id
)
SELECT (SELECT count(*) FROM d) AS saved`;

/**
 * Writes a save: the answers (the technician's and the unit-record branches after it), the new
 * state, and the call repaired when the visit is verified. Says whether it landed: false when the
 * diagnosis changed since `revision` was read, is no longer open, or its call was closed.
 */
export async function commitSave(
  {
    companyId,
    callId,
    id,
    revision,
    status,
    findingStepId,
    currentState,
    energy,
    lastSeq,
    rows,
    repaired,
  }: {
    companyId: string;
    callId: string;
    id: string;
    revision: number;
    status: DiagnosisStatus;
    findingStepId: string | null;
    currentState: string;
    energy: EnergyState;
    lastSeq: number;
    rows: AnswerRow[];
    repaired: boolean;
  },
  trx: Knex = db,
): Promise<boolean> {
  const json = rows.map((a) => ({
    id: a.id,
    company_id: companyId,
    diagnosis_id: id,
    user_id: a.userId,
    seq: a.seq,
    created_at: a.createdAt.toISOString(),
    client_id: a.clientId,
    step_id: a.stepId,
    step_kind: a.stepKind,
    text: a.text ?? null,
    value: a.value ?? null,
    unit: a.unit ?? null,
    quantity: a.quantity ?? null,
    band_index: a.bandIndex ?? null,
    band_label: a.bandLabel ?? null,
    verdict: a.verdict ?? null,
    choice: a.choice ?? null,
    confirmed: a.confirmed ?? null,
    over_range: a.overRange ?? false,
    auto: a.auto ?? false,
    response: a.response ?? null,
  }));
  const result = await trx.raw(COMMIT_SAVE, {
    callId,
    companyId,
    id,
    revision,
    status,
    findingStepId,
    currentState,
    ...energyColumns(energy),
    lastSeq,
    rows: JSON.stringify(json),
    repaired,
  });
  return Number(result.rows[0].saved) === 1;
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
