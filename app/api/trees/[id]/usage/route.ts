// GET /api/trees/{id}/usage – per published version: diagnoses run, findings reached, where diagnoses were escalated or abandoned.
import { routeOf } from '@/lib/server/operation';
import { treeUsageOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const GET = routeOf(treeUsageOp, { params: { id: 'treeId' } });
