import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/knex';
import { isUuid } from '@/db/users';
import { notFound } from '@/lib/errors';
import type { Scope } from '@/lib/policy';
import type { Role } from '@/lib/roles';
import type { CallStatus } from '@/lib/validations/field';

export interface Verification {
  cycles: number;
  flameSignal: { text: string; value: number } | null;
  checks: { text: string; done: boolean }[];
  notes?: string;
}

export interface ServiceCall {
  id: string;
  unitId: string;
  unitLabel: string;
  siteId: string;
  siteName: string;
  siteAddress: string;
  complaint: string;
  status: CallStatus;
  technicianId: string | null;
  technicianName: string | null;
  technicianRole: Role | null;
  repairNotes: string | null;
  verification: Verification | null;
  openedAt: Date;
  closedAt: Date | null;
  closedByName: string | null;
}

export const CLOSED_STATUSES: readonly CallStatus[] = ['closed', 'referred'];

/** The calls a scope reaches (lib/policy.ts): its company's, narrowed to the user's own or supervised ones. */
export function scopeCalls(query: Knex.QueryBuilder, scope: Scope, alias = 'c'): Knex.QueryBuilder {
  query.where(`${alias}.company_id`, scope.companyId);
  if (scope.reach === 'company') return query;
  if (scope.reach === 'supervised') {
    return query.where((q) =>
      q
        .where(`${alias}.technician_id`, scope.userId)
        .orWhereIn(`${alias}.technician_id`, db('users').select('id').where({ company_id: scope.companyId, role: 'apprentice' })),
    );
  }
  return query.where(`${alias}.technician_id`, scope.userId);
}

const callQuery = (scope: Scope, trx: Knex) =>
  scopeCalls(
    trx('service_calls as c')
      .join('units as u', 'u.id', 'c.unit_id')
      .join('sites as s', 's.id', 'u.site_id')
      .leftJoin('users as t', 't.id', 'c.technician_id')
      .leftJoin('users as cb', 'cb.id', 'c.closed_by')
      .select(
        'c.*',
        'u.label as unit_label',
        's.id as site_id',
        's.name as site_name',
        's.address as site_address',
        't.name as technician_name',
        't.role as technician_role',
        'cb.name as closed_by_name',
      ),
    scope,
  );

const toCall = (r: Record<string, unknown>): ServiceCall => ({
  id: r.id as string,
  unitId: r.unit_id as string,
  unitLabel: r.unit_label as string,
  siteId: r.site_id as string,
  siteName: r.site_name as string,
  siteAddress: r.site_address as string,
  complaint: r.complaint as string,
  status: r.status as CallStatus,
  technicianId: (r.technician_id as string | null) ?? null,
  technicianName: (r.technician_name as string | null) ?? null,
  technicianRole: (r.technician_role as Role | null) ?? null,
  repairNotes: (r.repair_notes as string | null) ?? null,
  verification: (r.verification as Verification | null) ?? null,
  openedAt: r.opened_at as Date,
  closedAt: (r.closed_at as Date | null) ?? null,
  closedByName: (r.closed_by_name as string | null) ?? null,
});

export async function listCalls(
  { scope, status, technicianId, unitId }: { scope: Scope; status?: CallStatus; technicianId?: string; unitId?: string },
  trx: Knex = db,
): Promise<ServiceCall[]> {
  const q = callQuery(scope, trx).orderBy('c.opened_at', 'desc').limit(500);
  if (status) q.where('c.status', status);
  if (technicianId) q.where('c.technician_id', technicianId);
  if (unitId) q.where('c.unit_id', unitId);
  return (await q).map(toCall);
}

/**
 * One call the scope reaches. `lock` takes the call's row lock: `share` while changing something
 * that hangs off the call (a diagnosis), `update` while changing the call itself. Locks are always
 * taken call first, then diagnosis, so two units of work never wait on each other in a circle.
 */
export async function getCall(
  { scope, id, lock }: { scope: Scope; id: string; lock?: 'share' | 'update' },
  trx: Knex = db,
): Promise<ServiceCall> {
  if (!isUuid(id)) throw notFound('That service call');
  const q = callQuery(scope, trx).where('c.id', id);
  if (lock === 'share') q.forShare('c');
  if (lock === 'update') q.forUpdate('c');
  const row = await q.first();
  if (!row) throw notFound('That service call');
  return toCall(row);
}

export async function createCall(
  {
    companyId,
    unitId,
    complaint,
    technicianId,
    createdBy,
  }: { companyId: string; unitId: string; complaint: string; technicianId: string | null; createdBy: string },
  trx: Knex = db,
): Promise<string> {
  const [row] = await trx('service_calls')
    .insert({ company_id: companyId, unit_id: unitId, complaint, technician_id: technicianId, created_by: createdBy })
    .returning('id');
  return row.id;
}

/** Moves the call to `status` if it is in one of `from`; says whether it did. */
export async function setCallStatus(
  { companyId, id, status, from }: { companyId: string; id: string; status: CallStatus; from: readonly CallStatus[] },
  trx: Knex = db,
): Promise<boolean> {
  const count = await trx('service_calls')
    .where({ id, company_id: companyId })
    .whereIn('status', from as CallStatus[])
    .update({ status });
  return count > 0;
}

/** Stores the repair on a call that is still open; says whether it did. */
export async function recordRepair(
  { companyId, id, repairNotes, verification }: { companyId: string; id: string; repairNotes: string; verification: Verification },
  trx: Knex = db,
): Promise<boolean> {
  const count = await trx('service_calls')
    .where({ id, company_id: companyId })
    .whereNotIn('status', CLOSED_STATUSES as CallStatus[])
    .update({ repair_notes: repairNotes, verification: JSON.stringify(verification), status: 'repaired' });
  return count > 0;
}

/** Closes or refers a call that is still open; of several at once, exactly one does. */
export async function closeCall(
  { companyId, id, outcome, closedBy }: { companyId: string; id: string; outcome: 'closed' | 'referred'; closedBy: string },
  trx: Knex = db,
): Promise<boolean> {
  const count = await trx('service_calls')
    .where({ id, company_id: companyId })
    .whereNotIn('status', CLOSED_STATUSES as CallStatus[])
    .update({ status: outcome, closed_at: trx.fn.now(), closed_by: closedBy });
  return count > 0;
}

/**
 * Reopens a closed or referred call; of several at once, exactly one does. It goes back to where
 * its work stands: repaired when a repair is recorded, diagnosing when a diagnosis was started,
 * else open.
 */
export async function reopenCall({ companyId, id }: { companyId: string; id: string }, trx: Knex = db): Promise<boolean> {
  const count = await trx('service_calls')
    .where({ id, company_id: companyId })
    .whereIn('status', CLOSED_STATUSES as CallStatus[])
    .update({
      status: trx.raw(
        `CASE WHEN repair_notes IS NOT NULL THEN 'repaired'
              WHEN EXISTS (SELECT 1 FROM diagnoses d WHERE d.call_id = service_calls.id) THEN 'diagnosing'
              ELSE 'open' END`,
      ),
      closed_at: null,
      closed_by: null,
    });
  return count > 0;
}

/** Gives an open call to another technician, if it is still open and still with `from`; says whether it did. */
export async function assignCall(
  { companyId, id, from, to }: { companyId: string; id: string; from: string | null; to: string },
  trx: Knex = db,
): Promise<boolean> {
  const q = trx('service_calls')
    .where({ id, company_id: companyId })
    .whereNotIn('status', CLOSED_STATUSES as CallStatus[]);
  if (from) q.where('technician_id', from);
  else q.whereNull('technician_id');
  return (await q.update({ technician_id: to })) > 0;
}

export const CALL_EVENT_KINDS = ['closed', 'referred', 'reopened', 'reassigned', 'signed_off'] as const;
export type CallEventKind = (typeof CALL_EVENT_KINDS)[number];

export interface CallEvent {
  id: string;
  kind: CallEventKind;
  at: Date;
  actorName: string | null;
  note: string | null;
  diagnosisId: string | null;
  fromName: string | null;
  toName: string | null;
}

/** Records what happened to a call, in the unit of work that made it happen. */
export async function recordCallEvent(
  {
    companyId,
    callId,
    kind,
    actorId,
    note = null,
    diagnosisId = null,
    fromUserId = null,
    toUserId = null,
  }: {
    companyId: string;
    callId: string;
    kind: CallEventKind;
    actorId: string;
    note?: string | null;
    diagnosisId?: string | null;
    fromUserId?: string | null;
    toUserId?: string | null;
  },
  trx: Knex = db,
): Promise<void> {
  await trx('call_events').insert({
    company_id: companyId,
    call_id: callId,
    kind,
    actor_id: actorId,
    note,
    diagnosis_id: diagnosisId,
    from_user_id: fromUserId,
    to_user_id: toUserId,
  });
}

/** A call's record, oldest first. The caller has already checked that the scope reaches the call. */
export async function listCallEvents({ companyId, callId }: { companyId: string; callId: string }, trx: Knex = db): Promise<CallEvent[]> {
  const rows = await trx('call_events as e')
    .leftJoin('users as a', 'a.id', 'e.actor_id')
    .leftJoin('users as f', 'f.id', 'e.from_user_id')
    .leftJoin('users as t', 't.id', 'e.to_user_id')
    .where({ 'e.company_id': companyId, 'e.call_id': callId })
    .orderBy([{ column: 'e.at' }, { column: 'e.id' }])
    .select('e.*', 'a.name as actor_name', 'f.name as from_name', 't.name as to_name');
  return rows.map((r) => ({
    id: r.id,
    kind: r.kind,
    at: r.at,
    actorName: r.actor_name ?? null,
    note: r.note ?? null,
    diagnosisId: r.diagnosis_id ?? null,
    fromName: r.from_name ?? null,
    toName: r.to_name ?? null,
  }));
}

/** Field users of the company a call can be assigned to. */
export async function listAssignees(
  { companyId }: { companyId: string },
  trx: Knex = db,
): Promise<{ id: string; name: string; role: Role }[]> {
  return trx('users')
    .where({ company_id: companyId, active: true })
    .whereIn('role', ['apprentice', 'technician', 'lead'])
    .orderBy('name')
    .select('id', 'name', 'role');
}
