// GET /api/calls?status=&technician= – the calls the user reaches; POST /api/calls – opens one.
import { routeOf } from '@/lib/server/operation';
import { createCallOp, listCallsOp } from '@/lib/server/operations/field';

export const dynamic = 'force-dynamic';

export const GET = routeOf(listCallsOp, { query: true });
export const POST = routeOf(createCallOp, { status: 201 });
