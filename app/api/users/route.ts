// GET /api/users – the company's users; POST /api/users – adds one (admin).
import { routeOf } from '@/lib/server/operation';
import { createUserOp, listUsersOp } from '@/lib/server/operations/company';

export const dynamic = 'force-dynamic';

export const GET = routeOf(listUsersOp);
export const POST = routeOf(createUserOp, { status: 201 });
