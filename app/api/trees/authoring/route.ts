// GET /api/trees/authoring – every tree with its published version, open drafts and reviews, who edits, the last change.
import { routeOf } from '@/lib/server/operation';
import { listAuthoringTreesOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const GET = routeOf(listAuthoringTreesOp);
