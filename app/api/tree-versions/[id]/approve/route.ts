// POST /api/tree-versions/{id}/approve – approves a submitted version (a different lead or an admin than its author).
import { routeOf } from '@/lib/server/operation';
import { approveVersionOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const POST = routeOf(approveVersionOp, { params: { id: 'id' } });
