// GET /api/tree-versions/{id}/authoring – the version as the editor sees it (graph as stored, problems, review comments).
import { routeOf } from '@/lib/server/operation';
import { getAuthoringVersionOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getAuthoringVersionOp, { params: { id: 'id' } });
