// DELETE /api/diagnoses/{id}/answers/last?last={clientId} – undoes the last answer (kept on record, off the path).
import { routeOf } from '@/lib/server/operation';
import { undoAnswerOp } from '@/lib/server/operations/diagnoses';

export const DELETE = routeOf(undoAnswerOp, { params: { id: 'diagnosisId' }, query: true });
