// POST /api/auth/sign-out – ends this session on the server and clears its cookie.
import { routeOf } from '@/lib/server/operation';
import { signOutOp } from '@/lib/server/operations/auth';

export const POST = routeOf(signOutOp, { status: 204 });
