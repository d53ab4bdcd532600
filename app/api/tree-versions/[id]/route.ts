// GET /api/tree-versions/{id} – one version of a fault tree with its graph (steps as the API shapes them).
import { routeOf } from '@/lib/server/operation';
import { getTreeVersionOp } from '@/lib/server/operations/diagnoses';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getTreeVersionOp, { params: { id: 'id' } });
