// GET /api/tree-versions/{id}/validation – the problems the validator finds in the version.
import { routeOf } from '@/lib/server/operation';
import { validateVersionOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const GET = routeOf(validateVersionOp, { params: { id: 'id' } });
