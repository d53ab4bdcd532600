// GET /api/me – the signed-in user and their company.
import { route } from '@/lib/server/guard';
import { publicUser } from '@/lib/server/auth';

export const dynamic = 'force-dynamic';

export const GET = route({ roles: 'any' }, async ({ user }) => publicUser(user));
