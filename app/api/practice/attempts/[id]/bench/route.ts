// GET /api/practice/attempts/{id}/bench – the bench of the apprentice's running attempt: clock, sequence, power, call.
import { routeOf } from '@/lib/server/operation';
import { attemptBenchStateOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const GET = routeOf(attemptBenchStateOp, { params: { id: 'id' } });
