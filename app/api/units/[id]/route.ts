// GET /api/units/{id} – a unit with its readings history and its calls (technicians and up).
import { routeOf } from '@/lib/server/operation';
import { getUnitOp } from '@/lib/server/operations/field';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getUnitOp, { params: { id: 'id' } });
