// POST /api/practice/attempts/{id}/finish – the apprentice reports the finding; the server scores the attempt.
import { routeOf } from '@/lib/server/operation';
import { finishAttemptOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const POST = routeOf(finishAttemptOp, { params: { id: 'id' }, bodyAs: 'finding' });
