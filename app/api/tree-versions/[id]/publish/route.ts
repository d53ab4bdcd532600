// POST /api/tree-versions/{id}/publish – publishes an approved version after the validator finds nothing; retires the one before.
// 422 with the problems listed when the validator finds any, 409 when the version is not approved.
import { routeOf } from '@/lib/server/operation';
import { publishVersionOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const POST = routeOf(publishVersionOp, { params: { id: 'id' } });
