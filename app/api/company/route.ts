// GET /api/company – the signed-in user's company settings; PATCH – changes them (admin).
import { routeOf } from '@/lib/server/operation';
import { getCompanyOp, updateCompanyOp } from '@/lib/server/operations/company';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getCompanyOp);
export const PATCH = routeOf(updateCompanyOp);
