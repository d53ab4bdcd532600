// POST /api/practice/assignments/{id}/attempts – the apprentice starts (or resumes) an attempt on the bench.
import { routeOf } from '@/lib/server/operation';
import { startAttemptOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const POST = routeOf(startAttemptOp, { params: { id: 'id' }, status: 201 });
