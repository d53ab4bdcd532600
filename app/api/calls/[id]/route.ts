// GET /api/calls/{id} – a call with its unit and diagnoses.
import { routeOf } from '@/lib/server/operation';
import { getCallOp } from '@/lib/server/operations/field';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getCallOp, { params: { id: 'id' } });
