// GET /api/practice/apprentices/{id} – one apprentice's progress: attempts, faults isolated, diagnoses awaiting sign-off.
import { routeOf } from '@/lib/server/operation';
import { apprenticeProgressOp } from '@/lib/server/operations/practice';

export const dynamic = 'force-dynamic';

export const GET = routeOf(apprenticeProgressOp, { params: { id: 'id' } });
