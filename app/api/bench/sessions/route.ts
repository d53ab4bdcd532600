// POST /api/bench/sessions { faultId | null, unit, seed? } – a bench session of one's own (signed in).
import { routeOf } from '@/lib/server/operation';
import { createBenchSessionOp } from '@/lib/server/operations/bench';

export const dynamic = 'force-dynamic';

export const POST = routeOf(createBenchSessionOp, { status: 201 });
