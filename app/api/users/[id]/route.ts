// PATCH /api/users/{id} – changes name, role or active, or signs the user out everywhere (admin).
import { routeOf } from '@/lib/server/operation';
import { updateUserOp } from '@/lib/server/operations/company';

export const PATCH = routeOf(updateUserOp, { params: { id: 'id' }, bodyAs: 'patch' });
