// POST /api/diagnoses/{id}/answers – saves the answer to the current step (idempotent by clientId).
import { routeOf } from '@/lib/server/operation';
import { answerDiagnosisOp } from '@/lib/server/operations/diagnoses';

export const POST = routeOf(answerDiagnosisOp, { params: { id: 'diagnosisId' }, bodyAs: 'answer' });
