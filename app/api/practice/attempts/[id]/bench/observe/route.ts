// POST /api/practice/attempts/{id}/bench/observe – a look at the spark, the flame or a part on the attempt's bench.
import { routeOf } from '@/lib/server/operation';
import { attemptBenchObserveOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const POST = routeOf(attemptBenchObserveOp, { params: { id: 'id' }, bodyAs: 'body' });
