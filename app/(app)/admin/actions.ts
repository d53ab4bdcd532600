'use server';

import { revalidatePath } from 'next/cache';
import { z } from 'zod';
import { updateCompany } from '@/db/companies';
import { action } from '@/lib/server/guard';
import { addCompanyUser, changeCompanyUser } from '@/lib/server/users';
import { companySettingsSchema, createUserSchema, updateUserSchema, uuidSchema } from '@/lib/validations/users';

export const createUserAction = action({ roles: ['admin'], schema: createUserSchema }, async ({ user, input }) => {
  const created = await addCompanyUser({ admin: user, input });
  revalidatePath('/admin/users');
  return created;
});

export const updateUserAction = action(
  { roles: ['admin'], schema: z.object({ id: uuidSchema, patch: updateUserSchema }) },
  async ({ user, input }) => {
    const changed = await changeCompanyUser({ admin: user, id: input.id, patch: input.patch });
    revalidatePath('/admin/users');
    return changed;
  },
);

export const updateCompanyAction = action({ roles: ['admin'], schema: companySettingsSchema }, async ({ user, input }) => {
  const company = await updateCompany({ id: user.companyId, patch: input });
  revalidatePath('/', 'layout');
  return company;
});
