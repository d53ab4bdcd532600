import 'server-only';
import type { Knex } from 'knex';
import { scopeCalls } from '@/db/calls';
import { db } from '@/db/knex';
import { isUuid } from '@/db/users';
import { notFound } from '@/lib/errors';
import type { Scope } from '@/lib/policy';

// Photos of service calls (migrations/20261203004000_attachments.ts). Whoever reaches the call
// reaches its photos: every read that starts from an attachment id goes through the call's scope.

export interface Attachment {
  id: string;
  callId: string;
  answerId: string | null;
  /** The client id the wizard made for the answer (it knows its answers by that id). */
  answerClientId: string | null;
  diagnosisId: string | null;
  ownerId: string | null;
  ownerName: string | null;
  key: string;
  thumbKey: string;
  contentType: string;
  size: number;
  originalSize: number;
  width: number;
  height: number;
  createdAt: Date;
}

export interface ScopedAttachment extends Attachment {
  callStatus: string;
}

const COLUMNS = [
  'a.id',
  'a.call_id',
  'a.answer_id',
  'an.client_id as answer_client_id',
  'a.diagnosis_id',
  'a.owner_id',
  'o.name as owner_name',
  'a.key',
  'a.thumb_key',
  'a.content_type',
  'a.size',
  'a.original_size',
  'a.width',
  'a.height',
  'a.created_at',
];

function toAttachment(row: Record<string, unknown>): Attachment {
  return {
    id: row.id as string,
    callId: row.call_id as string,
    answerId: (row.answer_id as string | null) ?? null,
    answerClientId: (row.answer_client_id as string | null) ?? null,
    diagnosisId: (row.diagnosis_id as string | null) ?? null,
    ownerId: (row.owner_id as string | null) ?? null,
    ownerName: (row.owner_name as string | null) ?? null,
    key: row.key as string,
    thumbKey: row.thumb_key as string,
    contentType: row.content_type as string,
    size: Number(row.size),
    originalSize: Number(row.original_size),
    width: Number(row.width),
    height: Number(row.height),
    createdAt: row.created_at as Date,
  };
}

/** The photos of one call, oldest first. The caller has already checked that its scope reaches the call. */
export async function listAttachmentsForCall(
  { companyId, callId }: { companyId: string; callId: string },
  trx: Knex = db,
): Promise<Attachment[]> {
  const rows = await trx('attachments as a')
    .leftJoin('users as o', 'o.id', 'a.owner_id')
    .leftJoin('answers as an', 'an.id', 'a.answer_id')
    .where({ 'a.company_id': companyId, 'a.call_id': callId })
    .select(COLUMNS)
    .orderBy([{ column: 'a.created_at' }, { column: 'a.id' }]);
  return rows.map(toAttachment);
}

/** One photo whose call the scope reaches; 404 otherwise (the same answer for "none" and "not yours"). */
export async function getAttachment({ scope, id }: { scope: Scope; id: string }, trx: Knex = db): Promise<ScopedAttachment> {
  if (!isUuid(id)) throw notFound('That photo');
  const q = trx('attachments as a')
    .join('service_calls as c', 'c.id', 'a.call_id')
    .leftJoin('users as o', 'o.id', 'a.owner_id')
    .leftJoin('answers as an', 'an.id', 'a.answer_id')
    .where('a.id', id)
    .select([...COLUMNS, 'c.status as call_status']);
  const row = await scopeCalls(q, scope, 'c').first();
  if (!row) throw notFound('That photo');
  return { ...toAttachment(row), callStatus: row.call_status as string };
}

/** The answer (by its id or the client's id for it) of a diagnosis of this call, or null. */
export async function findAnswerOfCall(
  { companyId, callId, answerId }: { companyId: string; callId: string; answerId: string },
  trx: Knex = db,
): Promise<{ id: string; diagnosisId: string } | null> {
  if (!isUuid(answerId)) return null;
  const row = await trx('answers as an')
    .join('diagnoses as d', 'd.id', 'an.diagnosis_id')
    .where({ 'an.company_id': companyId, 'd.call_id': callId })
    .where((q) => q.where('an.id', answerId).orWhere('an.client_id', answerId))
    .first('an.id', 'an.diagnosis_id');
  return row ? { id: row.id, diagnosisId: row.diagnosis_id } : null;
}

/** A diagnosis of this call that reached a finding (a photo of the finding), or null. */
export async function findFindingOfCall(
  { companyId, callId, diagnosisId }: { companyId: string; callId: string; diagnosisId: string },
  trx: Knex = db,
): Promise<{ id: string } | null> {
  if (!isUuid(diagnosisId)) return null;
  const row = await trx('diagnoses')
    .where({ company_id: companyId, call_id: callId, id: diagnosisId })
    .whereNotNull('finding_step_id')
    .first('id');
  return row ? { id: row.id } : null;
}

export async function countAttachmentsForCall(
  { companyId, callId }: { companyId: string; callId: string },
  trx: Knex = db,
): Promise<number> {
  const row = await trx('attachments').where({ company_id: companyId, call_id: callId }).count<{ n: string }[]>({ n: '*' }).first();
  return Number(row?.n ?? 0);
}

export async function insertAttachment(
  a: {
    id: string;
    companyId: string;
    callId: string;
    answerId: string | null;
    diagnosisId: string | null;
    ownerId: string;
    key: string;
    thumbKey: string;
    contentType: string;
    size: number;
    originalSize: number;
    width: number;
    height: number;
  },
  trx: Knex = db,
): Promise<void> {
  await trx('attachments').insert({
    id: a.id,
    company_id: a.companyId,
    call_id: a.callId,
    answer_id: a.answerId,
    diagnosis_id: a.diagnosisId,
    owner_id: a.ownerId,
    key: a.key,
    thumb_key: a.thumbKey,
    content_type: a.contentType,
    size: a.size,
    original_size: a.originalSize,
    width: a.width,
    height: a.height,
  });
}

export async function deleteAttachmentRow({ companyId, id }: { companyId: string; id: string }, trx: Knex = db): Promise<void> {
  await trx('attachments').where({ company_id: companyId, id }).delete();
}
