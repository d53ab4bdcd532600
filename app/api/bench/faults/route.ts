// GET /api/bench/faults – the bench's fault library (titles and descriptions for trainers, leads and admins).
import { routeOf } from '@/lib/server/operation';
import { listBenchFaultsOp } from '@/lib/server/operations/bench';

export const dynamic = 'force-dynamic';

export const GET = routeOf(listBenchFaultsOp);
