// POST /api/calls/{id}/reopen – a lead or admin reopens a closed or referred call, saying why; recorded on the call.
import { routeOf } from '@/lib/server/operation';
import { reopenCallOp } from '@/lib/server/operations/field';

export const POST = routeOf(reopenCallOp, { params: { id: 'callId' } });
