// GET /api/practice – scenarios, apprentices, faults and every attempt of the company (trainers, leads, admins).
import { routeOf } from '@/lib/server/operation';
import { practiceOverviewOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const GET = routeOf(practiceOverviewOp);
