// GET /api/practice/attempts/{id} – one attempt; the fault and the path only once finished, or for trainers.
import { routeOf } from '@/lib/server/operation';
import { getAttemptOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getAttemptOp, { params: { id: 'id' } });
