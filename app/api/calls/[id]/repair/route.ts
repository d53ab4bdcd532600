// PUT /api/calls/{id}/repair – records the repair and its verification.
import { routeOf } from '@/lib/server/operation';
import { recordRepairOp } from '@/lib/server/operations/field';

export const PUT = routeOf(recordRepairOp, { params: { id: 'callId' } });
