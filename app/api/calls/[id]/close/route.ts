// POST /api/calls/{id}/close – closes (or refers) the call.
import { route } from '@/lib/server/guard';
import { FIELD_ROLES } from '@/lib/roles';
import { finishCall } from '@/lib/server/calls';
import { viewerOf } from '@/lib/server/viewer';
import { closeCallSchema } from '@/lib/validations/field';

export const POST = route({ roles: FIELD_ROLES, body: closeCallSchema }, async ({ user, params, body }) =>
  finishCall({ viewer: viewerOf(user), id: params.id, outcome: body.outcome }),
);
