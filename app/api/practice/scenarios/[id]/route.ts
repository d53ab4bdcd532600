// GET /api/practice/scenarios/{id} – one scenario with its assignments and attempts.
import { routeOf } from '@/lib/server/operation';
import { getScenarioOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getScenarioOp, { params: { id: 'id' } });
