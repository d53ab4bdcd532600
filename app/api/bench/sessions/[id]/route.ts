// GET /api/bench/sessions/{id} – the session's clock and sequence (the fault for trainers, leads and admins).
import { routeOf } from '@/lib/server/operation';
import { getBenchSessionOp } from '@/lib/server/operations/bench';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getBenchSessionOp, { params: { id: 'id' } });
