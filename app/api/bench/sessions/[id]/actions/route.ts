// POST /api/bench/sessions/{id}/actions { action, seconds? } – power, the call for heat, a rollout reset or a wait on the simulated clock.
import { routeOf } from '@/lib/server/operation';
import { benchActOp } from '@/lib/server/operations/bench';

export const dynamic = 'force-dynamic';

export const POST = routeOf(benchActOp, { params: { id: 'id' }, bodyAs: 'body' });
