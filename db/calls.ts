import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/knex';
import { isUuid } from '@/db/users';
import { AppError, notFound } from '@/lib/errors';
import type { Role } from '@/lib/roles';
import type { CallStatus } from '@/lib/validations/field';

/** Who is asking: every call query is scoped by the viewer's company and role. */
export interface Viewer {
  id: string;
  companyId: string;
  role: Role;
}

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

/**
 * Technicians and apprentices see their own calls (a technician also sees apprentices' calls,
 * to sign off their findings); leads and admins see every call of the company; trainers none.
 */
export function scopeCalls(query: Knex.QueryBuilder, viewer: Viewer, alias = 'c'): Knex.QueryBuilder {
  query.where(`${alias}.company_id`, viewer.companyId);
  if (viewer.role === 'lead' || viewer.role === 'admin') return query;
  if (viewer.role === 'technician') {
    return query.where((q) =>
      q
        .where(`${alias}.technician_id`, viewer.id)
        .orWhereIn(`${alias}.technician_id`, db('users').select('id').where({ company_id: viewer.companyId, role: 'apprentice' })),
    );
  }
  if (viewer.role === 'apprentice') return query.where(`${alias}.technician_id`, viewer.id);
  return query.whereRaw('false');
}

const callQuery = (viewer: Viewer) =>
  scopeCalls(
    db('service_calls as c')
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
    viewer,
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

export async function listCalls({
  viewer,
  status,
  technicianId,
  unitId,
}: {
  viewer: Viewer;
  status?: CallStatus;
  technicianId?: string;
  unitId?: string;
}): Promise<ServiceCall[]> {
  const q = callQuery(viewer).orderBy('c.opened_at', 'desc').limit(500);
  if (status) q.where('c.status', status);
  if (technicianId) q.where('c.technician_id', technicianId);
  if (unitId) q.where('c.unit_id', unitId);
  return (await q).map(toCall);
}

export async function getCall({ viewer, id }: { viewer: Viewer; id: string }): Promise<ServiceCall> {
  if (!isUuid(id)) throw notFound('That service call');
  const row = await callQuery(viewer).where('c.id', id).first();
  if (!row) throw notFound('That service call');
  return toCall(row);
}

export async function createCall({
  viewer,
  unitId,
  complaint,
  technicianId,
}: {
  viewer: Viewer;
  unitId: string;
  complaint: string;
  technicianId: string | null;
}): Promise<ServiceCall> {
  const [row] = await db('service_calls')
    .insert({ company_id: viewer.companyId, unit_id: unitId, complaint, technician_id: technicianId, created_by: viewer.id })
    .returning('id');
  return getCall({ viewer: { ...viewer, role: 'admin' }, id: row.id });
}

export async function setCallStatus(
  { viewer, id, status, from }: { viewer: Viewer; id: string; status: CallStatus; from?: CallStatus[] },
  trx: Knex = db,
): Promise<void> {
  const q = trx('service_calls').where({ id, company_id: viewer.companyId });
  if (from) q.whereIn('status', from);
  await q.update({ status });
}

export async function recordRepair({
  viewer,
  id,
  repairNotes,
  verification,
}: {
  viewer: Viewer;
  id: string;
  repairNotes: string;
  verification: Verification;
}): Promise<ServiceCall> {
  const call = await getCall({ viewer, id });
  if (call.status === 'closed' || call.status === 'referred')
    throw new AppError('conflict', 'This call is closed; its record cannot change.');
  await db('service_calls')
    .where({ id, company_id: viewer.companyId })
    .update({ repair_notes: repairNotes, verification: JSON.stringify(verification), status: 'repaired' });
  return getCall({ viewer, id });
}

export async function closeCall({
  viewer,
  id,
  outcome,
}: {
  viewer: Viewer;
  id: string;
  outcome: 'closed' | 'referred';
}): Promise<ServiceCall> {
  await db('service_calls')
    .where({ id, company_id: viewer.companyId })
    .update({ status: outcome, closed_at: db.fn.now(), closed_by: viewer.id });
  return getCall({ viewer, id });
}

/** Field users of the company a call can be assigned to. */
export async function listAssignees({ companyId }: { companyId: string }) {
  return db('users')
    .where({ company_id: companyId, active: true })
    .whereIn('role', ['apprentice', 'technician', 'lead'])
    .orderBy('name')
    .select('id', 'name', 'role');
}
