// GET /api/practice/assignments – an apprentice's own assignments (everyone's for trainers, leads and admins).
import { routeOf } from '@/lib/server/operation';
import { listAssignmentsOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const GET = routeOf(listAssignmentsOp);
