// GET /api/units – the company's units; POST /api/units – adds one to a site.
import { routeOf } from '@/lib/server/operation';
import { createUnitOp, listUnitsOp } from '@/lib/server/operations/field';

export const dynamic = 'force-dynamic';

export const GET = routeOf(listUnitsOp);
export const POST = routeOf(createUnitOp, { status: 201 });
