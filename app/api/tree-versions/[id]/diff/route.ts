// GET /api/tree-versions/{id}/diff?against={otherId|builtin} – what changed from the other version to this one.
import { routeOf } from '@/lib/server/operation';
import { diffVersionsOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const GET = routeOf(diffVersionsOp, { params: { id: 'id' }, query: true });
