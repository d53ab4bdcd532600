import 'server-only';
import { createUser, listUsers, updateUser, type User } from '@/db/users';
import { AppError } from '@/lib/errors';
import type { CurrentUser } from '@/lib/server/guard';
import { hashPassword } from '@/lib/server/password';
import type { CreateUserInput, UpdateUserInput } from '@/lib/validations/users';

// Shared by the admin's server actions and the /api/users handlers.

export function publicAdminUser(user: User) {
  return { id: user.id, email: user.email, name: user.name, role: user.role, active: user.active, createdAt: user.createdAt };
}

export async function listCompanyUsers({ admin }: { admin: CurrentUser }) {
  return (await listUsers({ companyId: admin.companyId })).map(publicAdminUser);
}

export async function addCompanyUser({ admin, input }: { admin: CurrentUser; input: CreateUserInput }) {
  const user = await createUser({
    companyId: admin.companyId,
    email: input.email,
    name: input.name,
    role: input.role,
    passwordHash: await hashPassword(input.password),
  });
  return publicAdminUser(user);
}

export async function changeCompanyUser({ admin, id, patch }: { admin: CurrentUser; id: string; patch: UpdateUserInput }) {
  // An admin cannot lock themselves out: no self-deactivation, no self-demotion.
  if (id === admin.id && (patch.active === false || (patch.role && patch.role !== 'admin'))) {
    throw new AppError('bad_request', 'You cannot deactivate yourself or remove your own admin role; ask another admin.');
  }
  return publicAdminUser(await updateUser({ companyId: admin.companyId, id, patch }));
}
