// POST /api/auth/sign-out-everywhere – ends every session of the signed-in user, this one included.
import { routeOf } from '@/lib/server/operation';
import { signOutEverywhereOp } from '@/lib/server/operations/auth';

export const POST = routeOf(signOutEverywhereOp, { status: 204 });
