// GET /api/company – the signed-in user's company settings; PATCH – changes them (admin only).
import { getCompany, updateCompany } from '@/db/companies';
import { route } from '@/lib/server/guard';
import { companySettingsSchema } from '@/lib/validations/users';

export const dynamic = 'force-dynamic';

export const GET = route({ roles: 'any' }, async ({ user }) => getCompany({ id: user.companyId }));

export const PATCH = route({ roles: ['admin'], body: companySettingsSchema }, async ({ user, body }) =>
  updateCompany({ id: user.companyId, patch: body }),
);
