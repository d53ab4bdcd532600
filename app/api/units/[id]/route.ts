// GET /api/units/{id} – a unit with its readings history and its calls (technicians and up).
import { routeOf } from '@/lib/server/operation';
import { correctUnitOp, getUnitOp } from '@/lib/server/operations/field';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getUnitOp, { params: { id: 'id' } });

// PATCH /api/units/{id} { ignition?, fuel?, controlSupply?, draft? } – the unit record corrected at the unit.
export const PATCH = routeOf(correctUnitOp, { params: { id: 'id' } });
