// GET /api/tree-versions/{id}/export – the version as an import/export document; 422 with the problems for a draft that has any.
import { routeOf } from '@/lib/server/operation';
import { exportVersionOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const GET = routeOf(exportVersionOp, { params: { id: 'id' } });
