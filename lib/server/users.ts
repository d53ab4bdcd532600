import 'server-only';
import { createUser, listUsers, updateUser, type User } from '@/db/users';
import { AppError } from '@/lib/errors';
import { hashPassword } from '@/lib/server/password';
import type { CreateUserInput, UpdateUserInput } from '@/lib/validations/users';

// Shared by the admin's server actions and the /api/users handlers.

export function publicAdminUser(user: User) {
  return { id: user.id, email: user.email, name: user.name, role: user.role, active: user.active, createdAt: user.createdAt };
}

export async function listCompanyUsers({ companyId }: { companyId: string }) {
  return (await listUsers({ companyId })).map(publicAdminUser);
}

export async function addCompanyUser({ companyId, input }: { companyId: string; input: CreateUserInput }) {
  const user = await createUser({
    companyId,
    email: input.email,
    name: input.name,
    role: input.role,
    passwordHash: await hashPassword(input.password),
  });
  return publicAdminUser(user);
}

export async function changeCompanyUser({
  companyId,
  actorId,
  id,
  patch,
}: {
  companyId: string;
  actorId: string;
  id: string;
  patch: UpdateUserInput;
}) {
  // An admin cannot lock themselves out: no self-deactivation, no self-demotion.
  if (id === actorId && (patch.active === false || (patch.role && patch.role !== 'admin'))) {
    throw new AppError('bad_request', 'You cannot deactivate yourself or remove your own admin role; ask another admin.');
  }
  return publicAdminUser(await updateUser({ companyId, id, patch }));
}
