// POST /api/practice/attempts/{id}/answers – one answer of the attempt's walk, checked against its bench; a finding ends and scores it.
import { routeOf } from '@/lib/server/operation';
import { answerAttemptOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const POST = routeOf(answerAttemptOp, { params: { id: 'id' }, bodyAs: 'answer' });
