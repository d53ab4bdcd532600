// POST /api/tree-versions/{id}/submit – submits a draft without problems for review by another lead.
import { routeOf } from '@/lib/server/operation';
import { submitVersionOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const POST = routeOf(submitVersionOp, { params: { id: 'id' } });
