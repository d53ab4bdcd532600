// DELETE /api/practice/attempts/{id}/answers/last?last={clientId} – takes back the walk's last answer (the bench's events stay).
import { routeOf } from '@/lib/server/operation';
import { undoAttemptAnswerOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const DELETE = routeOf(undoAttemptAnswerOp, { params: { id: 'id' }, query: true });
