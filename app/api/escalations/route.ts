// GET /api/escalations – escalated diagnoses on calls not yet closed, for leads and admins.
import { routeOf } from '@/lib/server/operation';
import { listEscalationsOp } from '@/lib/server/operations/diagnoses';

export const GET = routeOf(listEscalationsOp);
