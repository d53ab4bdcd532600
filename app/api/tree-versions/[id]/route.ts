// GET /api/tree-versions/{id} – one version of a fault tree with its graph (steps as the API shapes them).
import { getTreeVersion } from '@/db/trees';
import { route } from '@/lib/server/guard';
import { toApiStep } from '@/lib/server/steps';

export const dynamic = 'force-dynamic';

export const GET = route({ roles: 'any' }, async ({ user, params }) => {
  const v = await getTreeVersion({ companyId: user.companyId, id: params.id });
  return {
    id: v.id,
    treeId: v.treeId,
    slug: v.slug,
    title: v.title,
    version: v.version,
    status: v.status,
    publishedAt: v.publishedAt,
    graph: { start: v.graph.start, steps: v.graph.steps.map(toApiStep) },
  };
});
