// GET /api/tree-versions/{id}/isolation-check – every fault of the bench's library through the version.
import { routeOf } from '@/lib/server/operation';
import { isolationCheckOp } from '@/lib/server/operations/isolation';

export const dynamic = 'force-dynamic';

export const GET = routeOf(isolationCheckOp, { params: { id: 'id' }, query: true });
