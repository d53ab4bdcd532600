// PATCH /api/users/{id} – changes name, role or active, or revokes sessions. Admin only.
import { route } from '@/lib/server/guard';
import { changeCompanyUser } from '@/lib/server/users';
import { updateUserSchema } from '@/lib/validations/users';

export const PATCH = route({ roles: ['admin'], body: updateUserSchema }, async ({ user, params, body }) =>
  changeCompanyUser({ admin: user, id: params.id, patch: body }),
);
