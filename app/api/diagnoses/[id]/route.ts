// GET /api/diagnoses/{id} – where a diagnosis stands: its path, current step, finding.
import { routeOf } from '@/lib/server/operation';
import { getDiagnosisOp } from '@/lib/server/operations/diagnoses';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getDiagnosisOp, { params: { id: 'id' } });
