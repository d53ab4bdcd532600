// POST /api/practice/scenarios/{id}/assignments – a trainer assigns the scenario to one or more apprentices.
import { routeOf } from '@/lib/server/operation';
import { assignScenarioOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const POST = routeOf(assignScenarioOp, { params: { id: 'id' }, bodyAs: 'assignment' });
