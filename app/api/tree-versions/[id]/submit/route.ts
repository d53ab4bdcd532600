// POST /api/tree-versions/{id}/submit – submits a draft without problems for review by another lead:
// 422 with the problems listed (by step id in fieldErrors) when it has any, 409 when it is not a draft
// or was saved again since the revision named.
import { routeOf } from '@/lib/server/operation';
import { submitVersionOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const POST = routeOf(submitVersionOp, { params: { id: 'id' } });
