import 'server-only';
import {
  assignCall,
  CLOSED_STATUSES,
  closeCall,
  createCall,
  getCall,
  listAssignees,
  listCallEvents,
  listCalls,
  recordCallEvent,
  recordRepair,
  reopenCall,
} from '@/db/calls';
import { listAttachmentsForCall } from '@/db/attachments';
import { getCompany } from '@/db/companies';
import { listAnswersForDiagnoses, listDiagnosesForCall } from '@/db/diagnoses';
import { db } from '@/db/knex';
import { getSite, listSites, type Site } from '@/db/sites';
import { getTreeVersion, listTrees, type TreeVersionRecord } from '@/db/trees';
import { getUnit, listUnits, listUnitReadings, type Unit } from '@/db/units';
import { AppError } from '@/lib/errors';
import type { Scope } from '@/lib/policy';
import { getDiagnosisView } from '@/lib/server/diagnoses';
import { parseProcedureStateId } from '@/lib/trees/graph';

/** How the report names an inserted energy procedure: by what it does first. */
function procedureKind(stateId: string): 'lock-out' | 're-energize' | 'energy' | null {
  const parsed = parseProcedureStateId(stateId);
  if (!parsed) return null;
  if (parsed.changes.includes('lock-out')) return 'lock-out';
  if (parsed.changes.length === 1 && parsed.changes[0] === 're-energize') return 're-energize';
  return 'energy';
}
import type { Caution, FindingStep } from '@/lib/trees/schema';
import { parseReading } from '@/lib/units';
import type { CallInput, CallStatus, RepairInput } from '@/lib/validations/field';
import { getStep } from '@/machines/diagnosis-machine';

// Service calls: what the call operations and the calls, units and report pages share. Every
// function takes the scope the policy gives the operation (lib/policy.ts), never the user's role.

const isClosed = (status: CallStatus) => CLOSED_STATUSES.includes(status);

/**
 * Opens a call. A scope that reaches the whole company (leads, admins) dispatches to any field user;
 * anyone else opens calls for themselves.
 */
export async function openCall({ scope, input }: { scope: Scope; input: CallInput }) {
  return db.transaction(async (trx) => {
    await getUnit({ companyId: scope.companyId, id: input.unitId }, trx);
    let technicianId = input.technicianId ?? null;
    if (scope.reach !== 'company') {
      if (technicianId && technicianId !== scope.userId) {
        throw new AppError('forbidden', 'Only a lead or an admin can assign a call to someone else.', {
          fieldErrors: { technicianId: ['Leave it on yourself.'] },
        });
      }
      technicianId = scope.userId;
    } else if (technicianId) {
      const assignees = await listAssignees({ companyId: scope.companyId }, trx);
      if (!assignees.some((a) => a.id === technicianId)) {
        throw new AppError('bad_request', 'That technician is not an active field user of your company.', {
          fieldErrors: { technicianId: ['Choose someone from the list.'] },
        });
      }
    }
    const id = await createCall(
      { companyId: scope.companyId, unitId: input.unitId, complaint: input.complaint, technicianId, createdBy: scope.userId },
      trx,
    );
    return getCall({ scope, id }, trx);
  });
}

export async function findCalls({ scope, status, technician }: { scope: Scope; status?: CallStatus; technician?: string }) {
  return listCalls({ scope, status, technicianId: technician === 'me' ? scope.userId : technician });
}

export async function getCallDetail({ scope, id }: { scope: Scope; id: string }) {
  const call = await getCall({ scope, id });
  const [unit, diagnoses] = await Promise.all([
    getUnit({ companyId: scope.companyId, id: call.unitId }),
    listDiagnosesForCall({ companyId: scope.companyId, callId: id }),
  ]);
  return { call, unit, diagnoses };
}

export async function saveRepair({ scope, id, input }: { scope: Scope; id: string; input: RepairInput }) {
  let flameSignal: { text: string; value: number } | null = null;
  if (input.flameSignal) {
    const parsed = parseReading('udc', input.flameSignal, 'µA');
    if (!parsed.ok) throw new AppError('bad_request', parsed.message, { fieldErrors: { flameSignal: [parsed.message] } });
    flameSignal = { text: input.flameSignal, value: parsed.value };
  }
  return db.transaction(async (trx) => {
    const call = await getCall({ scope, id, lock: 'update' }, trx);
    const verification = { cycles: input.cycles, flameSignal, checks: input.checks, notes: input.notes };
    if (
      isClosed(call.status) ||
      !(await recordRepair({ companyId: scope.companyId, id, repairNotes: input.repairNotes, verification }, trx))
    ) {
      throw new AppError('conflict', 'This call is closed; its record cannot change.');
    }
    return getCall({ scope, id }, trx);
  });
}

/** Closes or refers a call, checked and changed under the call's row lock; of several at once, one wins. */
export async function finishCall({
  scope,
  userId,
  id,
  outcome,
  reason,
}: {
  scope: Scope;
  userId: string;
  id: string;
  outcome: 'closed' | 'referred';
  /** Why it is referred (required for a referral; the schema asks for it). */
  reason?: string;
}) {
  if (outcome === 'referred' && !reason) {
    throw new AppError('bad_request', 'Say why you refer the call.', { fieldErrors: { reason: ['Say why you refer the call.'] } });
  }
  return db.transaction(async (trx) => {
    const call = await getCall({ scope, id, lock: 'update' }, trx);
    if (isClosed(call.status)) throw new AppError('conflict', 'This call is already closed.');
    if (outcome === 'closed') {
      const diagnoses = await listDiagnosesForCall({ companyId: scope.companyId, callId: id }, trx);
      if (diagnoses.some((d) => d.status === 'in_progress')) {
        throw new AppError('conflict', 'A diagnosis on this call is still in progress: finish it, or refer the call.');
      }
      // The visit goes on in the wizard after the finding: repair, restore, verify.
      if (diagnoses.some((d) => d.status === 'found') && !call.repairNotes) {
        throw new AppError('conflict', 'Finish the visit in the wizard first: the repair, restoring power and gas, and its checks.');
      }
      if (diagnoses.some((d) => (d.status === 'found' || d.status === 'verified') && d.userRole === 'apprentice' && !d.signedOffBy)) {
        throw new AppError('conflict', "An apprentice's finding needs a technician's sign-off before the call can be closed.");
      }
      if (!diagnoses.some((d) => d.status === 'verified') && !call.repairNotes) {
        throw new AppError('conflict', 'Verify the repair in the wizard before closing the call, or refer the call.');
      }
    }
    if (!(await closeCall({ companyId: scope.companyId, id, outcome, closedBy: userId }, trx))) {
      throw new AppError('conflict', 'This call is already closed.');
    }
    await recordCallEvent(
      { companyId: scope.companyId, callId: id, kind: outcome, actorId: userId, note: outcome === 'referred' ? reason : null },
      trx,
    );
    return getCall({ scope, id }, trx);
  });
}

/** A lead or admin reopens a closed or referred call, saying why; of several at once, one wins. */
export async function reopenClosedCall({ scope, id, reason }: { scope: Scope; id: string; reason: string }) {
  return db.transaction(async (trx) => {
    const call = await getCall({ scope, id, lock: 'update' }, trx);
    if (!isClosed(call.status) || !(await reopenCall({ companyId: scope.companyId, id }, trx))) {
      throw new AppError('conflict', 'This call is not closed or referred, so there is nothing to reopen.');
    }
    await recordCallEvent({ companyId: scope.companyId, callId: id, kind: 'reopened', actorId: scope.userId, note: reason }, trx);
    return getCall({ scope, id }, trx);
  });
}

/** A lead or admin gives an open call to another active field user of the company. */
export async function reassignCall({ scope, id, technicianId }: { scope: Scope; id: string; technicianId: string }) {
  return db.transaction(async (trx) => {
    const call = await getCall({ scope, id, lock: 'update' }, trx);
    if (isClosed(call.status)) throw new AppError('conflict', 'This call is closed: reopen it before you reassign it.');
    const assignees = await listAssignees({ companyId: scope.companyId }, trx);
    if (!assignees.some((a) => a.id === technicianId)) {
      throw new AppError('bad_request', 'That technician is not an active field user of your company.', {
        fieldErrors: { technicianId: ['Choose someone from the list.'] },
      });
    }
    if (call.technicianId === technicianId) {
      throw new AppError('conflict', `The call is already with ${call.technicianName ?? 'that technician'}.`, {
        fieldErrors: { technicianId: ['Choose someone else.'] },
      });
    }
    if (!(await assignCall({ companyId: scope.companyId, id, from: call.technicianId, to: technicianId }, trx))) {
      throw new AppError('conflict', 'The call changed while you were assigning it. Look again and retry.');
    }
    await recordCallEvent(
      {
        companyId: scope.companyId,
        callId: id,
        kind: 'reassigned',
        actorId: scope.userId,
        fromUserId: call.technicianId,
        toUserId: technicianId,
      },
      trx,
    );
    return getCall({ scope, id }, trx);
  });
}

export async function getUnitWithHistory({ scope, id }: { scope: Scope; id: string }) {
  const unit = await getUnit({ companyId: scope.companyId, id });
  const [readings, calls] = await Promise.all([
    listUnitReadings({ companyId: scope.companyId, unitId: id }),
    listCalls({ scope, unitId: id }),
  ]);
  return { unit, readings, calls };
}

// ── Read models for the calls, units and report screens ─────────────────────────────────────

const DEFAULT_TREE_SLUG = 'no-heat-dsi';

/** The published version a new diagnosis runs: the company's default no-heat tree, else the first published one. */
export async function getDefaultTreeVersion({ scope }: { scope: Scope }): Promise<{ id: string; title: string; version: number } | null> {
  const trees = await listTrees({ companyId: scope.companyId });
  const tree = trees.find((t) => t.slug === DEFAULT_TREE_SLUG && t.published) ?? trees.find((t) => t.published);
  return tree?.published ? { id: tree.published.id, title: tree.title, version: tree.published.version } : null;
}

/** Sites with their units, for the new-call picker. */
export async function listSitesWithUnits({ scope }: { scope: Scope }): Promise<(Site & { units: Unit[] })[]> {
  const [sites, units] = await Promise.all([listSites({ companyId: scope.companyId }), listUnits({ companyId: scope.companyId })]);
  return sites.map((s) => ({ ...s, units: units.filter((u) => u.siteId === s.id) }));
}

/** Active field users a scope reaching the whole company may assign a call to; empty for everyone else. */
export async function listCallAssignees({ scope }: { scope: Scope }): Promise<{ id: string; name: string; role: string }[]> {
  if (scope.reach !== 'company') return [];
  return listAssignees({ companyId: scope.companyId });
}

async function versionsOf(companyId: string, ids: string[]): Promise<Map<string, TreeVersionRecord>> {
  const map = new Map<string, TreeVersionRecord>();
  for (const id of new Set(ids)) map.set(id, await getTreeVersion({ companyId, id }));
  return map;
}

export interface CallReading {
  id: string;
  diagnosisId: string;
  stepId: string;
  stepTitle: string;
  points: [string, string] | null;
  quantity: string | null;
  text: string | null;
  /** null for an over-range reading ("OL"). */
  value: number | null;
  unit: string | null;
  band: string | null;
  verdict: string | null;
  at: Date;
}

/** Everything the call page shows: the call, its unit and site, diagnoses with their findings, readings, and what the user may do. */
export async function getCallPage({ scope, id }: { scope: Scope; id: string }) {
  const { call, unit } = await getCallDetail({ scope, id });
  const site = await getSite({ companyId: scope.companyId, id: unit.siteId });
  const records = await listDiagnosesForCall({ companyId: scope.companyId, callId: id });
  const versions = await versionsOf(
    scope.companyId,
    records.map((d) => d.treeVersionId),
  );
  const answers = await listAnswersForDiagnoses({ companyId: scope.companyId, diagnosisIds: records.map((d) => d.id) });
  const versionOfDiagnosis = new Map(records.map((d) => [d.id, versions.get(d.treeVersionId)!]));

  const diagnoses = records.map((d) => {
    const v = versions.get(d.treeVersionId)!;
    const finding = d.findingStepId
      ? v.graph.steps.find((s): s is FindingStep => s.id === d.findingStepId && s.kind === 'finding')
      : undefined;
    return {
      id: d.id,
      status: d.status,
      treeTitle: v.title,
      treeVersion: v.version,
      startedBy: d.userName,
      startedByRole: d.userRole,
      startedById: d.userId,
      startedAt: d.startedAt,
      finishedAt: d.finishedAt,
      finding: finding ? { id: finding.id, title: finding.title, remedy: finding.remedy, verification: finding.verification } : null,
      signedOff: d.signedOffBy ? { by: d.signedOffByName, at: d.signedOffAt } : null,
      escalation: d.escalation,
      needsSignOff: (d.status === 'found' || d.status === 'verified') && d.userRole === 'apprentice' && !d.signedOffBy,
      answers: answers.filter((a) => a.diagnosisId === d.id).length,
    };
  });

  // Readings with a value, and resistances over the meter's range ("OL", stored without one).
  const readings: CallReading[] = answers
    .filter((a) => a.value !== null || a.overRange)
    .map((a) => {
      const step = getStep({ id: '', version: 0, graph: versionOfDiagnosis.get(a.diagnosisId)!.graph }, a.stepId);
      return {
        id: a.id,
        diagnosisId: a.diagnosisId,
        stepId: a.stepId,
        stepTitle: step?.title ?? a.stepId,
        points: step?.kind === 'measure' ? step.points : null,
        quantity: a.quantity,
        text: a.text,
        value: a.value,
        unit: a.unit,
        band: a.bandLabel,
        verdict: a.verdict,
        at: a.createdAt,
      };
    });

  const closed = call.status === 'closed' || call.status === 'referred';
  const defaultTree = closed ? null : await getDefaultTreeVersion({ scope });
  const events = await listCallEvents({ companyId: scope.companyId, callId: id });
  return { call, unit, site, diagnoses, readings, defaultTree, closed, events };
}
export type CallPage = Awaited<ReturnType<typeof getCallPage>>;

/** The service report: the call with every diagnosis's path, findings, repair, verification and the cautions observed. */
export async function getCallReport({ scope, id }: { scope: Scope; id: string }) {
  const { call, unit, site, diagnoses, events } = await getCallPage({ scope, id });
  const company = await getCompany({ id: scope.companyId });
  const cautions = new Map<string, Caution>();
  const paths = [];
  for (const d of diagnoses) {
    const view = await getDiagnosisView({ scope, id: d.id });
    const record = await getTreeVersion({ companyId: scope.companyId, id: view.treeVersionId });
    const version = { id: record.id, version: record.version, graph: record.graph };
    const steps = view.path.map((a) => {
      const step = getStep(version, a.stepId);
      for (const c of step?.cautions ?? []) cautions.set(`${c.signal}|${c.text}`, c);
      return {
        ...a,
        instruction: step?.instruction ?? '',
        points: step?.kind === 'measure' ? step.points : null,
        checklist: step?.kind === 'action' ? step.checklist : [],
        procedure: procedureKind(a.stepId),
      };
    });
    if (view.finding) for (const c of view.finding.cautions) cautions.set(`${c.signal}|${c.text}`, c);
    paths.push({ ...d, steps, findingDetail: view.finding, contradictions: view.contradictions });
  }
  const order = ['DANGER', 'WARNING', 'CAUTION', 'NOTICE'];
  const observed = [...cautions.values()].sort((a, b) => order.indexOf(a.signal) - order.indexOf(b.signal));
  // What the customer and the office read about a referral or a reopening: why.
  const reasons = events
    .filter((e) => (e.kind === 'referred' || e.kind === 'reopened') && e.note)
    .map((e) => ({ kind: e.kind, at: e.at, by: e.actorName, note: e.note! }));
  return {
    company: { name: company.name, officeEmail: company.officeEmail, timeZone: company.timeZone },
    call,
    unit,
    site,
    diagnoses: paths,
    cautions: observed,
    reasons,
    events: events.map(({ diagnosisId: _d, ...e }) => e),
    photos: (await listAttachmentsForCall({ companyId: scope.companyId, callId: id })).map((a) => ({
      id: a.id,
      answerId: a.answerId,
      caption: null,
    })),
  };
}

/** Calls of a unit with their findings, readings, and the flame signal across visits for the plot. */
export async function getUnitPage({ scope, id }: { scope: Scope; id: string }) {
  const { unit, readings, calls } = await getUnitWithHistory({ scope, id });
  const site = await getSite({ companyId: scope.companyId, id: unit.siteId });
  const diagnoses = (await Promise.all(calls.map((c) => listDiagnosesForCall({ companyId: scope.companyId, callId: c.id })))).flat();
  const versions = await versionsOf(
    scope.companyId,
    diagnoses.map((d) => d.treeVersionId),
  );
  const findingsByCall = new Map<string, string[]>();
  for (const d of diagnoses) {
    if (!d.findingStepId) continue;
    const title = versions.get(d.treeVersionId)!.graph.steps.find((s) => s.id === d.findingStepId)?.title ?? d.findingStepId;
    findingsByCall.set(d.callId, [...(findingsByCall.get(d.callId) ?? []), title]);
  }
  // Flame signals retaken after a repair, in the wizard (a reading of its own) or, for calls
  // recorded before the visit went on in the wizard, on the call's repair record.
  const isAfterRepair = (stepId: string) => stepId.startsWith('recheck--');
  const retaken = readings.filter((r) => r.quantity === 'udc' && isAfterRepair(r.stepId));
  const afterRepairOf = (c: (typeof calls)[number]) =>
    retaken.filter((r) => r.callId === c.id).at(-1)?.value ?? c.verification?.flameSignal?.value ?? null;
  const visits = calls.map((c) => ({
    id: c.id,
    openedAt: c.openedAt,
    complaint: c.complaint,
    status: c.status,
    technicianName: c.technicianName,
    findings: findingsByCall.get(c.id) ?? [],
    flameAfterRepair: afterRepairOf(c),
  }));
  const flame = {
    diagnosis: readings
      .filter((r) => r.quantity === 'udc' && !isAfterRepair(r.stepId))
      .map((r) => ({ at: r.takenAt, value: r.value, callId: r.callId })),
    afterRepair: [
      ...retaken.map((r) => ({ at: r.takenAt, value: r.value, callId: r.callId })),
      ...calls
        .filter((c) => c.verification?.flameSignal && !retaken.some((r) => r.callId === c.id))
        .map((c) => ({ at: c.closedAt ?? c.openedAt, value: c.verification!.flameSignal!.value, callId: c.id })),
    ],
    bands: await flameBands({ scope }),
  };
  return { unit, site, visits, readings, flame };
}
export type UnitPage = Awaited<ReturnType<typeof getUnitPage>>;

/** The flame-signal bands of the default tree, for the plot's reference areas. */
async function flameBands({ scope }: { scope: Scope }) {
  const tree = await getDefaultTreeVersion({ scope });
  if (!tree) return [];
  const record = await getTreeVersion({ companyId: scope.companyId, id: tree.id });
  const step = record.graph.steps.find((s) => s.kind === 'measure' && s.quantity === 'udc');
  return step?.kind === 'measure'
    ? step.bands.map((b) => ({ from: b.from ?? null, to: b.to ?? null, label: b.label, verdict: b.verdict }))
    : [];
}

/** Units of the company grouped by site, with the date of each unit's last call. */
export async function listUnitsBySite({ scope }: { scope: Scope }) {
  const sites = await listSitesWithUnits({ scope });
  const calls = await listCalls({ scope });
  const last = new Map<string, Date>();
  for (const c of calls) if (!last.has(c.unitId)) last.set(c.unitId, c.openedAt);
  return sites.map((s) => ({ ...s, units: s.units.map((u) => ({ ...u, lastCallAt: last.get(u.id) ?? null })) }));
}
