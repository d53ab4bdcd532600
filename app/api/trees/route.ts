// GET /api/trees – the company's fault trees with their published version.
import { listTrees } from '@/db/trees';
import { route } from '@/lib/server/guard';

export const dynamic = 'force-dynamic';

export const GET = route({ roles: 'any' }, async ({ user }) =>
  (await listTrees({ companyId: user.companyId })).map(({ id, slug, title, published }) => ({ id, slug, title, published })),
);
