// GET /api/trees – the company's fault trees with their published version.
// POST /api/trees – a new tree with a first draft (from scratch) → 201 { treeId, id, version, revision, status: "draft" }.
import { routeOf } from '@/lib/server/operation';
import { listTreesOp } from '@/lib/server/operations/diagnoses';
import { createTreeOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const GET = routeOf(listTreesOp);
export const POST = routeOf(createTreeOp, { status: 201 });
