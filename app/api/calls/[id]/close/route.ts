// POST /api/calls/{id}/close – closes (or refers) the call; of several at once, one wins and the others get 409.
import { routeOf } from '@/lib/server/operation';
import { closeCallOp } from '@/lib/server/operations/field';

export const POST = routeOf(closeCallOp, { params: { id: 'callId' } });
