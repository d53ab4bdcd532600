// POST /api/auth/sign-in – checks e-mail and password, starts a session and sets its cookie.
import { routeOf } from '@/lib/server/operation';
import { signInOp } from '@/lib/server/operations/auth';

export const POST = routeOf(signInOp);
