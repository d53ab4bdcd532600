// GET /api/health – whether the app and its database answer.
import { routeOf } from '@/lib/server/operation';
import { getHealthOp } from '@/lib/server/operations/auth';

export const dynamic = 'force-dynamic';

export const GET = routeOf(getHealthOp, { status: (health) => (health.ok ? 200 : 503) });
