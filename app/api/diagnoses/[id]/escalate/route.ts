// POST /api/diagnoses/{id}/escalate { note } – "none of these fits": the diagnosis ends as escalated, for the leads.
import { routeOf } from '@/lib/server/operation';
import { escalateDiagnosisOp } from '@/lib/server/operations/diagnoses';

export const POST = routeOf(escalateDiagnosisOp, { params: { id: 'diagnosisId' } });
