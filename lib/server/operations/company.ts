import 'server-only';
import { z } from 'zod';
import { getCompany, updateCompany } from '@/db/companies';
import { defineOperation } from '@/lib/server/operation';
import { noInput, recordId } from '@/lib/server/operations/shared';
import { addCompanyUser, changeCompanyUser, listCompanyUsers } from '@/lib/server/users';
import { adminUserSchema, companySchema } from '@/lib/validations/api';
import { companySettingsSchema, createUserSchema, updateUserSchema } from '@/lib/validations/users';

// GET /api/company
export const getCompanyOp = defineOperation({
  name: 'company.get',
  input: noInput,
  output: companySchema,
  handler: async ({ scope }) => getCompany({ id: scope.companyId }),
});

// PATCH /api/company · updateCompanyAction
export const updateCompanyOp = defineOperation({
  name: 'company.update',
  input: companySettingsSchema,
  output: companySchema,
  handler: async ({ scope, input }) => updateCompany({ id: scope.companyId, patch: input }),
});

// GET /api/users
export const listUsersOp = defineOperation({
  name: 'users.list',
  input: noInput,
  output: z.array(adminUserSchema),
  handler: async ({ scope }) => listCompanyUsers({ companyId: scope.companyId }),
});

// POST /api/users · createUserAction
export const createUserOp = defineOperation({
  name: 'users.create',
  input: createUserSchema,
  output: adminUserSchema,
  handler: async ({ scope, input }) => addCompanyUser({ companyId: scope.companyId, input }),
});

// PATCH /api/users/{id} · updateUserAction
export const updateUserOp = defineOperation({
  name: 'users.update',
  fieldsUnder: 'patch',
  input: z.object({ id: recordId, patch: updateUserSchema }),
  output: adminUserSchema,
  handler: async ({ scope, user, input }) =>
    changeCompanyUser({ companyId: scope.companyId, actorId: user.id, id: input.id, patch: input.patch }),
});
