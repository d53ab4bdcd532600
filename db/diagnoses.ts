import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/knex';
import { isUuid } from '@/db/users';
import { notFound } from '@/lib/errors';

export type DiagnosisStatus = 'in_progress' | 'found' | 'escalated';

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
});

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
  userId: (r.user_id as string | null) ?? null,
  createdAt: r.created_at as Date,
  undoneAt: (r.undone_at as Date | null) ?? null,
  response: r.response ?? null,
});

const diagnosisQuery = (trx: Knex) =>
  trx('diagnoses as d')
    .leftJoin('users as u', 'u.id', 'd.user_id')
    .leftJoin('users as so', 'so.id', 'd.signed_off_by')
    .select('d.*', 'u.name as user_name', 'u.role as user_role', 'so.name as signed_off_by_name');

/** Company scope only: the caller checks that the viewer may see the diagnosis's call. */
export async function getDiagnosis(
  { companyId, id, forUpdate = false }: { companyId: string; id: string; forUpdate?: boolean },
  trx: Knex = db,
): Promise<DiagnosisRecord> {
  if (!isUuid(id)) throw notFound('That diagnosis');
  if (forUpdate) await trx('diagnoses').where({ id, company_id: companyId }).forUpdate().first('id');
  const row = await diagnosisQuery(trx).where({ 'd.id': id, 'd.company_id': companyId }).first();
  if (!row) throw notFound('That diagnosis');
  return toDiagnosis(row);
}

export async function listDiagnosesForCall({ companyId, callId }: { companyId: string; callId: string }): Promise<DiagnosisRecord[]> {
  return (await diagnosisQuery(db).where({ 'd.company_id': companyId, 'd.call_id': callId }).orderBy('d.started_at')).map(toDiagnosis);
}

export async function createDiagnosis(
  { companyId, callId, treeVersionId, userId }: { companyId: string; callId: string; treeVersionId: string; userId: string },
  trx: Knex = db,
): Promise<string> {
  const [row] = await trx('diagnoses')
    .insert({ company_id: companyId, call_id: callId, tree_version_id: treeVersionId, user_id: userId })
    .returning('id');
  return row.id;
}

export async function updateDiagnosisOutcome(
  { companyId, id, status, findingStepId }: { companyId: string; id: string; status: DiagnosisStatus; findingStepId: string | null },
  trx: Knex = db,
): Promise<void> {
  await trx('diagnoses')
    .where({ id, company_id: companyId })
    .update({ status, finding_step_id: findingStepId, finished_at: status === 'in_progress' ? null : trx.fn.now() });
}

export async function signOffDiagnosis({ companyId, id, userId }: { companyId: string; id: string; userId: string }): Promise<void> {
  await db('diagnoses').where({ id, company_id: companyId }).update({ signed_off_by: userId, signed_off_at: db.fn.now() });
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

export async function listAnswersForDiagnoses({
  companyId,
  diagnosisIds,
}: {
  companyId: string;
  diagnosisIds: string[];
}): Promise<(AnswerRecord & { diagnosisId: string })[]> {
  if (!diagnosisIds.length) return [];
  const rows = await db('answers')
    .where('company_id', companyId)
    .whereIn('diagnosis_id', diagnosisIds)
    .whereNull('undone_at')
    .orderBy(['diagnosis_id', 'seq']);
  return rows.map((r: Record<string, unknown>) => ({ ...toAnswer(r), diagnosisId: r.diagnosis_id as string }));
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
}

export async function insertAnswer(
  { companyId, diagnosisId, userId, answer }: { companyId: string; diagnosisId: string; userId: string; answer: NewAnswer },
  trx: Knex = db,
): Promise<AnswerRecord> {
  const [{ next }] = await trx('answers').where({ diagnosis_id: diagnosisId }).select(trx.raw('coalesce(max(seq), 0) + 1 as next'));
  const [row] = await trx('answers')
    .insert({
      company_id: companyId,
      diagnosis_id: diagnosisId,
      user_id: userId,
      seq: next,
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
    })
    .returning('*');
  return toAnswer(row);
}

export async function saveAnswerResponse({ id, response }: { id: string; response: unknown }, trx: Knex = db): Promise<void> {
  await trx('answers')
    .where({ id })
    .update({ response: JSON.stringify(response) });
}

export async function markAnswerUndone({ id }: { id: string }, trx: Knex = db): Promise<void> {
  await trx('answers').where({ id }).update({ undone_at: trx.fn.now() });
}
