// PUT /api/calls/{id}/repair – records the repair and its verification.
import { route } from '@/lib/server/guard';
import { FIELD_ROLES } from '@/lib/roles';
import { saveRepair } from '@/lib/server/calls';
import { viewerOf } from '@/lib/server/viewer';
import { repairSchema } from '@/lib/validations/field';

export const PUT = route({ roles: FIELD_ROLES, body: repairSchema }, async ({ user, params, body }) =>
  saveRepair({ viewer: viewerOf(user), id: params.id, input: body }),
);
