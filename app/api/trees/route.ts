// GET /api/trees – the company's fault trees with their published version.
import { routeOf } from '@/lib/server/operation';
import { listTreesOp } from '@/lib/server/operations/diagnoses';

export const dynamic = 'force-dynamic';

export const GET = routeOf(listTreesOp);
