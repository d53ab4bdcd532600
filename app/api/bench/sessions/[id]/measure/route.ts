// POST /api/bench/sessions/{id}/measure { mode, a, b } | { mode: 'udc', series } – a meter reading as the unit would give it now.
import { routeOf } from '@/lib/server/operation';
import { benchMeasureOp } from '@/lib/server/operations/bench';

export const dynamic = 'force-dynamic';

export const POST = routeOf(benchMeasureOp, { params: { id: 'id' }, bodyAs: 'body' });
