// GET /api/me – the signed-in user and their company.
import { routeOf } from '@/lib/server/operation';
import { getMeOp } from '@/lib/server/operations/auth';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getMeOp);
