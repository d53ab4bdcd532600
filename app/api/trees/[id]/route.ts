// GET /api/trees/{id} – one tree: its versions, the audit trail, a built-in update if one is offered.
import { routeOf } from '@/lib/server/operation';
import { getTreeDetailOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getTreeDetailOp, { params: { id: 'treeId' } });
