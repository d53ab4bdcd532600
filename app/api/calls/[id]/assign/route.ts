// POST /api/calls/{id}/assign – a lead or admin gives an open call to another field user; recorded on the call.
import { routeOf } from '@/lib/server/operation';
import { assignCallOp } from '@/lib/server/operations/field';

export const POST = routeOf(assignCallOp, { params: { id: 'callId' } });
