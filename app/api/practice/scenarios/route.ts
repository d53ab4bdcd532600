// POST /api/practice/scenarios – a trainer creates a practice scenario.
import { routeOf } from '@/lib/server/operation';
import { createScenarioOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const POST = routeOf(createScenarioOp, { status: 201 });
