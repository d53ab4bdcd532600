// POST /api/practice/attempts/{id}/bench/measure – a meter reading on the attempt's bench (400 with why when it cannot be taken).
import { routeOf } from '@/lib/server/operation';
import { attemptBenchMeasureOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const POST = routeOf(attemptBenchMeasureOp, { params: { id: 'id' }, bodyAs: 'body' });
