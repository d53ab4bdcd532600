// GET /api/sites – the company's sites; POST /api/sites – adds one.
import { routeOf } from '@/lib/server/operation';
import { createSiteOp, listSitesOp } from '@/lib/server/operations/field';

export const dynamic = 'force-dynamic';

export const GET = routeOf(listSitesOp);
export const POST = routeOf(createSiteOp, { status: 201 });
