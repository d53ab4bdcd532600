// POST /api/trees/{id}/drafts – { fromVersionId? | fromBuiltin? } a new draft (a copy, the built-in revision, or from scratch) → 201.
import { routeOf } from '@/lib/server/operation';
import { startDraftOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const POST = routeOf(startDraftOp, { params: { id: 'treeId' }, bodyAs: 'draft', status: 201 });
