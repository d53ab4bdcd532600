// GET /api/tree-versions/{id} – one version of a fault tree with its graph (steps as the API shapes them), status and revision.
// PUT /api/tree-versions/{id} – { baseRevision, graph } saves a draft: 200, 422 saved with problems, 409 stale or not a draft.
import { routeOf } from '@/lib/server/operation';
import { getTreeVersionOp } from '@/lib/server/operations/diagnoses';
import { saveDraftOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getTreeVersionOp, { params: { id: 'id' } });
export const PUT = routeOf(saveDraftOp, {
  params: { id: 'id' },
  status: (out) => (out.outcome === 'stale' ? 409 : out.problems.length > 0 ? 422 : 200),
});
