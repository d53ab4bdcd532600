import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/knex';

// The outbox (migrations/20261203005000_outbox.ts): e-mails waiting to be sent, being sent, sent
// or given up on. Writers enqueue inside their own request; the worker claims due rows with
// SKIP LOCKED, so two passes (or two app processes) never send the same row at once.

export type OutboxKind = 'report' | 'sign-off' | 'escalation' | 'tree-review' | 'scenario';
export type OutboxStatus = 'queued' | 'sending' | 'sent' | 'failed';

export interface OutboxMessage {
  id: string;
  companyId: string;
  callId: string | null;
  kind: OutboxKind;
  idempotencyKey: string;
  recipients: string[];
  subject: string;
  body: string;
  attachmentName: string | null;
  status: OutboxStatus;
  attempts: number;
  maxAttempts: number;
  nextAttemptAt: Date;
  lastError: string | null;
  messageId: string | null;
  sentAt: Date | null;
  createdBy: string | null;
  createdByName: string | null;
  createdAt: Date;
}

/** A claimed message, with its attachment's bytes. */
export interface OutboxDelivery extends OutboxMessage {
  attachment: Buffer | null;
}

const COLUMNS = [
  'o.id',
  'o.company_id',
  'o.call_id',
  'o.kind',
  'o.idempotency_key',
  'o.recipients',
  'o.subject',
  'o.body',
  'o.attachment_name',
  'o.status',
  'o.attempts',
  'o.max_attempts',
  'o.next_attempt_at',
  'o.last_error',
  'o.message_id',
  'o.sent_at',
  'o.created_by',
  'o.created_at',
];

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- a row straight from pg
function toMessage(r: any): OutboxMessage {
  return {
    id: r.id,
    companyId: r.company_id,
    callId: r.call_id ?? null,
    kind: r.kind,
    idempotencyKey: r.idempotency_key,
    recipients: r.recipients,
    subject: r.subject,
    body: r.body,
    attachmentName: r.attachment_name ?? null,
    status: r.status,
    attempts: r.attempts,
    maxAttempts: r.max_attempts,
    nextAttemptAt: r.next_attempt_at,
    lastError: r.last_error ?? null,
    messageId: r.message_id ?? null,
    sentAt: r.sent_at ?? null,
    createdBy: r.created_by ?? null,
    createdByName: r.created_by_name ?? null,
    createdAt: r.created_at,
  };
}

export interface EnqueueInput {
  companyId: string;
  callId?: string | null;
  kind: OutboxKind;
  idempotencyKey: string;
  recipients: string[];
  subject: string;
  body: string;
  attachment?: { name: string; content: Buffer } | null;
  createdBy?: string | null;
}

/**
 * Queues a message once per idempotency key: the same key again (a double click, a retried
 * request) answers the message already queued, with `created: false`.
 */
export async function enqueueMessage(input: EnqueueInput, trx: Knex = db): Promise<{ message: OutboxMessage; created: boolean }> {
  const inserted = await trx('outbox')
    .insert({
      company_id: input.companyId,
      call_id: input.callId ?? null,
      kind: input.kind,
      idempotency_key: input.idempotencyKey,
      recipients: JSON.stringify(input.recipients),
      subject: input.subject,
      body: input.body,
      attachment: input.attachment?.content ?? null,
      attachment_name: input.attachment?.name ?? null,
      created_by: input.createdBy ?? null,
    })
    .onConflict(['company_id', 'idempotency_key'])
    .ignore()
    .returning('id');
  const created = inserted.length > 0;
  const row = await trx('outbox as o')
    .leftJoin('users as u', 'u.id', 'o.created_by')
    .where({ 'o.company_id': input.companyId, 'o.idempotency_key': input.idempotencyKey })
    .first([...COLUMNS, 'u.name as created_by_name']);
  return { message: toMessage(row), created };
}

export async function getMessage({ companyId, id }: { companyId: string; id: string }, trx: Knex = db): Promise<OutboxMessage | null> {
  if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
  const row = await trx('outbox as o')
    .leftJoin('users as u', 'u.id', 'o.created_by')
    .where({ 'o.company_id': companyId, 'o.id': id })
    .first([...COLUMNS, 'u.name as created_by_name']);
  return row ? toMessage(row) : null;
}

/** The attachment of a stored message (for a resend). */
export async function getAttachment({ companyId, id }: { companyId: string; id: string }, trx: Knex = db): Promise<Buffer | null> {
  const row = await trx('outbox').where({ company_id: companyId, id }).first('attachment');
  return row?.attachment ?? null;
}

/** The messages of one call, newest first (the call's e-mail status). */
export async function listMessagesForCall({ companyId, callId }: { companyId: string; callId: string }, trx: Knex = db) {
  const rows = await trx('outbox as o')
    .leftJoin('users as u', 'u.id', 'o.created_by')
    .where({ 'o.company_id': companyId, 'o.call_id': callId })
    .orderBy('o.created_at', 'desc')
    .select([...COLUMNS, 'u.name as created_by_name']);
  return rows.map(toMessage);
}

/**
 * Takes up to `limit` due messages for sending: queued ones whose time has come, and ones a
 * crashed or stuck pass claimed whose lease ran out. Each claim counts as an attempt.
 */
export async function claimDueMessages(
  { limit = 5, leaseSeconds = 120 }: { limit?: number; leaseSeconds?: number } = {},
  trx: Knex = db,
): Promise<OutboxDelivery[]> {
  const { rows } = await trx.raw(
    `UPDATE outbox SET status = 'sending', attempts = attempts + 1,
            locked_until = clock_timestamp() + make_interval(secs => ?), updated_at = clock_timestamp()
      WHERE id IN (
        SELECT id FROM outbox
         WHERE (status = 'queued' AND next_attempt_at <= clock_timestamp())
            OR (status = 'sending' AND locked_until < clock_timestamp())
         ORDER BY next_attempt_at
         LIMIT ?
         FOR UPDATE SKIP LOCKED)
      RETURNING *`,
    [leaseSeconds, limit],
  );
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- rows straight from pg
  return rows.map((r: any): OutboxDelivery => ({ ...toMessage(r), attachment: r.attachment ?? null }));
}

export async function markSent({ id, messageId }: { id: string; messageId: string | null }, trx: Knex = db): Promise<void> {
  await trx('outbox')
    .where({ id, status: 'sending' })
    .update({
      status: 'sent',
      message_id: messageId,
      sent_at: trx.raw('clock_timestamp()'),
      locked_until: null,
      last_error: null,
      updated_at: trx.raw('clock_timestamp()'),
    });
}

/** A failed attempt: queued again after `retryInMs`, or failed for good once its attempts are spent. */
export async function markAttemptFailed(
  { id, error, retryInMs }: { id: string; error: string; retryInMs: number },
  trx: Knex = db,
): Promise<OutboxStatus> {
  const [row] = await trx('outbox')
    .where({ id, status: 'sending' })
    .update({
      status: trx.raw(`CASE WHEN attempts >= max_attempts THEN 'failed' ELSE 'queued' END`),
      next_attempt_at: trx.raw(`clock_timestamp() + make_interval(secs => ?)`, [retryInMs / 1000]),
      locked_until: null,
      last_error: error.slice(0, 500),
      updated_at: trx.raw('clock_timestamp()'),
    })
    .returning('status');
  return row?.status ?? 'failed';
}

/** Messages of a company waiting to be sent (queued or being sent). */
export async function countPending({ companyId }: { companyId?: string } = {}, trx: Knex = db): Promise<number> {
  const q = trx('outbox').whereIn('status', ['queued', 'sending']);
  if (companyId) q.where({ company_id: companyId });
  const row = await q.first(trx.raw('count(*)::int as n'));
  return (row as unknown as { n: number }).n;
}

// ── Notification settings (migrations/20261203005100_notification_settings.ts) ────────────────

/** The kinds a user turned off; every other kind is on. */
export async function listDisabledNotifications({ companyId, userId }: { companyId: string; userId: string }, trx: Knex = db) {
  const rows = await trx('notification_settings').where({ company_id: companyId, user_id: userId, enabled: false }).select('kind');
  return rows.map((r: { kind: string }) => r.kind);
}

export async function saveNotificationSettings(
  { companyId, userId, settings }: { companyId: string; userId: string; settings: Record<string, boolean> },
  trx: Knex = db,
): Promise<void> {
  const rows = Object.entries(settings).map(([kind, enabled]) => ({
    company_id: companyId,
    user_id: userId,
    kind,
    enabled,
    updated_at: trx.fn.now(),
  }));
  if (rows.length === 0) return;
  await trx('notification_settings').insert(rows).onConflict(['user_id', 'kind']).merge(['enabled', 'updated_at']);
}

/** Active users of the company with one of `roles` who have not turned `kind` off, optionally leaving one out. */
export async function listNotifiable(
  {
    companyId,
    roles,
    kind,
    except,
    userIds,
  }: { companyId: string; roles?: string[]; kind: string; except?: string | null; userIds?: string[] },
  trx: Knex = db,
): Promise<{ id: string; name: string; email: string }[]> {
  const q = trx('users as u')
    .where({ 'u.company_id': companyId, 'u.active': true })
    .whereNotExists(function () {
      this.select(1).from('notification_settings as n').whereRaw('n.user_id = u.id').andWhere({ 'n.kind': kind, 'n.enabled': false });
    })
    .orderBy('u.name')
    .select('u.id', 'u.name', 'u.email');
  if (roles) q.whereIn('u.role', roles);
  if (userIds) q.whereIn('u.id', userIds);
  if (except) q.whereNot('u.id', except);
  return q;
}
