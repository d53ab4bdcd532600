// POST /api/practice/attempts/{id}/bench/actions – power, call for heat, rollout reset or wait on the attempt's bench.
import { routeOf } from '@/lib/server/operation';
import { attemptBenchActOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const POST = routeOf(attemptBenchActOp, { params: { id: 'id' }, bodyAs: 'body' });
