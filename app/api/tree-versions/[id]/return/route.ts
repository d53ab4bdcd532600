// POST /api/tree-versions/{id}/return – { comments: [{ stepId?, text }] } sends a version in review back to draft.
import { routeOf } from '@/lib/server/operation';
import { returnVersionOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const POST = routeOf(returnVersionOp, { params: { id: 'id' } });
