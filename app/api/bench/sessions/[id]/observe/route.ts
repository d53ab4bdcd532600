// POST /api/bench/sessions/{id}/observe { what } – what the spark or flame does now.
import { routeOf } from '@/lib/server/operation';
import { benchObserveOp } from '@/lib/server/operations/bench';

export const dynamic = 'force-dynamic';

export const POST = routeOf(benchObserveOp, { params: { id: 'id' }, bodyAs: 'body' });
