import 'server-only';
import { closeCall, createCall, getCall, listAssignees, listCalls, recordRepair, type Viewer } from '@/db/calls';
import { getCompany } from '@/db/companies';
import { getDiagnosis, listAnswersForDiagnoses, listDiagnosesForCall, signOffDiagnosis } from '@/db/diagnoses';
import { getSite, listSites, type Site } from '@/db/sites';
import { getTreeVersion, listTrees, type TreeVersionRecord } from '@/db/trees';
import { getUnit, listUnits, listUnitReadings, type Unit } from '@/db/units';
import { getDiagnosisView } from '@/lib/server/diagnoses';
import { LOCK_OUT_PREFIX, RE_ENERGIZE_PREFIX } from '@/lib/trees/graph';
import type { Caution, FindingStep } from '@/lib/trees/schema';
import { getStep } from '@/machines/diagnosis-machine';
import { AppError } from '@/lib/errors';
import { parseReading } from '@/lib/units';
import type { CallInput, CallStatus, RepairInput } from '@/lib/validations/field';

// Service calls: shared by the route handlers and the server actions.

const FIELD = new Set(['apprentice', 'technician', 'lead', 'admin']);

export function assertField(viewer: Viewer) {
  if (!FIELD.has(viewer.role)) throw new AppError('forbidden', 'Service calls are for field roles; trainers work with practice scenarios.');
}

export async function openCall({ viewer, input }: { viewer: Viewer; input: CallInput }) {
  assertField(viewer);
  await getUnit({ companyId: viewer.companyId, id: input.unitId });
  let technicianId = input.technicianId ?? null;
  if (viewer.role === 'technician' || viewer.role === 'apprentice') {
    // Field users open calls for themselves; leads and admins dispatch to anyone.
    if (technicianId && technicianId !== viewer.id) {
      throw new AppError('forbidden', 'Only a lead or an admin can assign a call to someone else.', {
        fieldErrors: { technicianId: ['Leave it on yourself.'] },
      });
    }
    technicianId = viewer.id;
  } else if (technicianId) {
    const assignees = await listAssignees({ companyId: viewer.companyId });
    if (!assignees.some((a: { id: string }) => a.id === technicianId)) {
      throw new AppError('bad_request', 'That technician is not an active field user of your company.', {
        fieldErrors: { technicianId: ['Choose someone from the list.'] },
      });
    }
  }
  return createCall({ viewer, unitId: input.unitId, complaint: input.complaint, technicianId });
}

export async function findCalls({ viewer, status, technician }: { viewer: Viewer; status?: CallStatus; technician?: string }) {
  if (viewer.role === 'trainer') return [];
  return listCalls({ viewer, status, technicianId: technician === 'me' ? viewer.id : technician });
}

export async function getCallDetail({ viewer, id }: { viewer: Viewer; id: string }) {
  assertFieldOr404(viewer);
  const call = await getCall({ viewer, id });
  const unit = await getUnit({ companyId: viewer.companyId, id: call.unitId });
  const diagnoses = await listDiagnosesForCall({ companyId: viewer.companyId, callId: id });
  return { call, unit, diagnoses };
}

function assertFieldOr404(viewer: Viewer) {
  if (!FIELD.has(viewer.role)) throw new AppError('not_found', 'That service call was not found.');
}

export async function saveRepair({ viewer, id, input }: { viewer: Viewer; id: string; input: RepairInput }) {
  assertFieldOr404(viewer);
  let flameSignal: { text: string; value: number } | null = null;
  if (input.flameSignal) {
    const parsed = parseReading('udc', input.flameSignal, 'µA');
    if (!parsed.ok) throw new AppError('bad_request', parsed.message, { fieldErrors: { flameSignal: [parsed.message] } });
    flameSignal = { text: input.flameSignal, value: parsed.value };
  }
  return recordRepair({
    viewer,
    id,
    repairNotes: input.repairNotes,
    verification: { cycles: input.cycles, flameSignal, checks: input.checks, notes: input.notes },
  });
}

export async function finishCall({ viewer, id, outcome }: { viewer: Viewer; id: string; outcome: 'closed' | 'referred' }) {
  assertFieldOr404(viewer);
  const call = await getCall({ viewer, id });
  if (call.status === 'closed' || call.status === 'referred') throw new AppError('conflict', 'This call is already closed.');
  if (viewer.role === 'apprentice') throw new AppError('forbidden', 'A technician closes the call.');
  const diagnoses = await listDiagnosesForCall({ companyId: viewer.companyId, callId: id });
  if (outcome === 'closed') {
    if (diagnoses.some((d) => d.status === 'in_progress')) {
      throw new AppError('conflict', 'A diagnosis on this call is still in progress: finish it, or refer the call.');
    }
    const unsigned = diagnoses.filter((d) => d.status === 'found' && d.userRole === 'apprentice' && !d.signedOffBy);
    if (unsigned.length)
      throw new AppError('conflict', "An apprentice's finding needs a technician's sign-off before the call can be closed.");
    if (!call.repairNotes) throw new AppError('conflict', 'Record the repair and its verification before closing the call.');
  }
  return closeCall({ viewer, id, outcome });
}

export async function signOff({ viewer, diagnosisId }: { viewer: Viewer; diagnosisId: string }) {
  if (!['technician', 'lead', 'admin'].includes(viewer.role))
    throw new AppError('forbidden', 'A technician, lead or admin signs off a finding.');
  const diagnosis = await getDiagnosis({ companyId: viewer.companyId, id: diagnosisId });
  await getCall({ viewer, id: diagnosis.callId });
  if (diagnosis.status !== 'found') throw new AppError('conflict', 'Only a diagnosis that reached its finding can be signed off.');
  if (diagnosis.userId === viewer.id) throw new AppError('forbidden', 'Someone else signs off your own finding.');
  await signOffDiagnosis({ companyId: viewer.companyId, id: diagnosisId, userId: viewer.id });
}

export async function getUnitWithHistory({ viewer, id }: { viewer: Viewer; id: string }) {
  assertFieldOr404(viewer);
  const unit = await getUnit({ companyId: viewer.companyId, id });
  const readings = await listUnitReadings({ companyId: viewer.companyId, unitId: id });
  const calls = await listCalls({ viewer: { ...viewer, role: 'admin' }, unitId: id });
  return { unit, readings, calls };
}

// ── Read models for the calls, units and report screens ─────────────────────────────────────

const DEFAULT_TREE_SLUG = 'no-heat-dsi';

/** The published version a new diagnosis runs: the company's default no-heat tree, else the first published one. */
export async function getDefaultTreeVersion({
  viewer,
}: {
  viewer: Viewer;
}): Promise<{ id: string; title: string; version: number } | null> {
  const trees = await listTrees({ companyId: viewer.companyId });
  const tree = trees.find((t) => t.slug === DEFAULT_TREE_SLUG && t.published) ?? trees.find((t) => t.published);
  return tree?.published ? { id: tree.published.id, title: tree.title, version: tree.published.version } : null;
}

/** Sites with their units, for the new-call picker. */
export async function listSitesWithUnits({ viewer }: { viewer: Viewer }): Promise<(Site & { units: Unit[] })[]> {
  assertField(viewer);
  const [sites, units] = await Promise.all([listSites({ companyId: viewer.companyId }), listUnits({ companyId: viewer.companyId })]);
  return sites.map((s) => ({ ...s, units: units.filter((u) => u.siteId === s.id) }));
}

/** Active field users a lead or admin may assign a call to; empty for everyone else. */
export async function listCallAssignees({ viewer }: { viewer: Viewer }): Promise<{ id: string; name: string; role: string }[]> {
  if (viewer.role !== 'lead' && viewer.role !== 'admin') return [];
  return listAssignees({ companyId: viewer.companyId });
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
  value: number;
  unit: string | null;
  band: string | null;
  verdict: string | null;
  at: Date;
}

/** Everything the call page shows: the call, its unit and site, diagnoses with their findings, readings, and what the viewer may do. */
export async function getCallPage({ viewer, id }: { viewer: Viewer; id: string }) {
  const { call, unit } = await getCallDetail({ viewer, id });
  const site = await getSite({ companyId: viewer.companyId, id: unit.siteId });
  const records = await listDiagnosesForCall({ companyId: viewer.companyId, callId: id });
  const versions = await versionsOf(
    viewer.companyId,
    records.map((d) => d.treeVersionId),
  );
  const answers = await listAnswersForDiagnoses({ companyId: viewer.companyId, diagnosisIds: records.map((d) => d.id) });
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
      needsSignOff: d.status === 'found' && d.userRole === 'apprentice' && !d.signedOffBy,
      answers: answers.filter((a) => a.diagnosisId === d.id).length,
    };
  });

  const readings: CallReading[] = answers
    .filter((a) => a.value !== null)
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
        value: a.value as number,
        unit: a.unit,
        band: a.bandLabel,
        verdict: a.verdict,
        at: a.createdAt,
      };
    });

  const closed = call.status === 'closed' || call.status === 'referred';
  const defaultTree = closed ? null : await getDefaultTreeVersion({ viewer });
  return { call, unit, site, diagnoses, readings, defaultTree, closed };
}
export type CallPage = Awaited<ReturnType<typeof getCallPage>>;

/** The service report: the call with every diagnosis's path, findings, repair, verification and the cautions observed. */
export async function getCallReport({ viewer, id }: { viewer: Viewer; id: string }) {
  const { call, unit, site, diagnoses } = await getCallPage({ viewer, id });
  const company = await getCompany({ id: viewer.companyId });
  const cautions = new Map<string, Caution>();
  const paths = [];
  for (const d of diagnoses) {
    const view = await getDiagnosisView({ viewer, id: d.id });
    const record = await getTreeVersion({ companyId: viewer.companyId, id: view.treeVersionId });
    const version = { id: record.id, version: record.version, graph: record.graph };
    const steps = view.path.map((a) => {
      const step = getStep(version, a.stepId);
      for (const c of step?.cautions ?? []) cautions.set(`${c.signal}|${c.text}`, c);
      return {
        ...a,
        instruction: step?.instruction ?? '',
        points: step?.kind === 'measure' ? step.points : null,
        checklist: step?.kind === 'action' ? step.checklist : [],
        procedure: a.stepId.startsWith(LOCK_OUT_PREFIX) ? 'lock-out' : a.stepId.startsWith(RE_ENERGIZE_PREFIX) ? 're-energize' : null,
      };
    });
    if (view.finding) for (const c of view.finding.cautions) cautions.set(`${c.signal}|${c.text}`, c);
    paths.push({ ...d, steps, findingDetail: view.finding, contradictions: view.contradictions });
  }
  const order = ['DANGER', 'WARNING', 'CAUTION', 'NOTICE'];
  const observed = [...cautions.values()].sort((a, b) => order.indexOf(a.signal) - order.indexOf(b.signal));
  return { company: { name: company.name, officeEmail: company.officeEmail }, call, unit, site, diagnoses: paths, cautions: observed };
}
export type CallReport = Awaited<ReturnType<typeof getCallReport>>;

/** Calls of a unit with their findings, readings, and the flame signal across visits for the plot. */
export async function getUnitPage({ viewer, id }: { viewer: Viewer; id: string }) {
  const { unit, readings, calls } = await getUnitWithHistory({ viewer, id });
  const site = await getSite({ companyId: viewer.companyId, id: unit.siteId });
  const diagnoses = (await Promise.all(calls.map((c) => listDiagnosesForCall({ companyId: viewer.companyId, callId: c.id })))).flat();
  const versions = await versionsOf(
    viewer.companyId,
    diagnoses.map((d) => d.treeVersionId),
  );
  const findingsByCall = new Map<string, string[]>();
  for (const d of diagnoses) {
    if (!d.findingStepId) continue;
    const title = versions.get(d.treeVersionId)!.graph.steps.find((s) => s.id === d.findingStepId)?.title ?? d.findingStepId;
    findingsByCall.set(d.callId, [...(findingsByCall.get(d.callId) ?? []), title]);
  }
  const visits = calls.map((c) => ({
    id: c.id,
    openedAt: c.openedAt,
    complaint: c.complaint,
    status: c.status,
    technicianName: c.technicianName,
    findings: findingsByCall.get(c.id) ?? [],
    flameAfterRepair: c.verification?.flameSignal?.value ?? null,
  }));
  const flame = {
    diagnosis: readings.filter((r) => r.quantity === 'udc').map((r) => ({ at: r.takenAt, value: r.value, callId: r.callId })),
    afterRepair: calls
      .filter((c) => c.verification?.flameSignal)
      .map((c) => ({ at: c.closedAt ?? c.openedAt, value: c.verification!.flameSignal!.value, callId: c.id })),
    bands: await flameBands({ viewer }),
  };
  return { unit, site, visits, readings, flame };
}
export type UnitPage = Awaited<ReturnType<typeof getUnitPage>>;

/** The flame-signal bands of the default tree, for the plot's reference areas. */
async function flameBands({ viewer }: { viewer: Viewer }) {
  const tree = await getDefaultTreeVersion({ viewer });
  if (!tree) return [];
  const record = await getTreeVersion({ companyId: viewer.companyId, id: tree.id });
  const step = record.graph.steps.find((s) => s.kind === 'measure' && s.quantity === 'udc');
  return step?.kind === 'measure'
    ? step.bands.map((b) => ({ from: b.from ?? null, to: b.to ?? null, label: b.label, verdict: b.verdict }))
    : [];
}

/** Units of the company grouped by site, with the date of each unit's last call. */
export async function listUnitsBySite({ viewer }: { viewer: Viewer }) {
  assertFieldOr404(viewer);
  const sites = await listSitesWithUnits({ viewer });
  const calls = await listCalls({ viewer: { ...viewer, role: 'admin' } });
  const last = new Map<string, Date>();
  for (const c of calls) if (!last.has(c.unitId)) last.set(c.unitId, c.openedAt);
  return sites.map((s) => ({ ...s, units: s.units.map((u) => ({ ...u, lastCallAt: last.get(u.id) ?? null })) }));
}
