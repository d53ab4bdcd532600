// POST /api/diagnoses/{id}/sign-off – a technician, lead or admin signs off someone else's finding.
import { routeOf } from '@/lib/server/operation';
import { signOffDiagnosisOp } from '@/lib/server/operations/diagnoses';

export const POST = routeOf(signOffDiagnosisOp, { params: { id: 'diagnosisId' } });
