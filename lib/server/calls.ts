import 'server-only';
import { closeCall, createCall, getCall, listAssignees, listCalls, recordRepair, type Viewer } from '@/db/calls';
import { getDiagnosis, listDiagnosesForCall, signOffDiagnosis } from '@/db/diagnoses';
import { getUnit, listUnitReadings } from '@/db/units';
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
      throw new AppError('forbidden', 'Only a lead or an admin can assign a call to someone else.', { fieldErrors: { technicianId: ['Leave it on yourself.'] } });
    }
    technicianId = viewer.id;
  } else if (technicianId) {
    const assignees = await listAssignees({ companyId: viewer.companyId });
    if (!assignees.some((a: { id: string }) => a.id === technicianId)) {
      throw new AppError('bad_request', 'That technician is not an active field user of your company.', { fieldErrors: { technicianId: ['Choose someone from the list.'] } });
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
    if (unsigned.length) throw new AppError('conflict', "An apprentice's finding needs a technician's sign-off before the call can be closed.");
    if (!call.repairNotes) throw new AppError('conflict', 'Record the repair and its verification before closing the call.');
  }
  return closeCall({ viewer, id, outcome });
}

export async function signOff({ viewer, diagnosisId }: { viewer: Viewer; diagnosisId: string }) {
  if (!['technician', 'lead', 'admin'].includes(viewer.role)) throw new AppError('forbidden', 'A technician, lead or admin signs off a finding.');
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
