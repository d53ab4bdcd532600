// GET /api/sites – the company's sites; POST /api/sites – adds one.
import { NextResponse } from 'next/server';
import { createSite, listSites } from '@/db/sites';
import { route } from '@/lib/server/guard';
import { FIELD_ROLES } from '@/lib/roles';
import { siteSchema } from '@/lib/validations/field';

export const dynamic = 'force-dynamic';

export const GET = route({ roles: FIELD_ROLES }, async ({ user }) => listSites({ companyId: user.companyId }));

export const POST = route({ roles: FIELD_ROLES, body: siteSchema }, async ({ user, body }) =>
  NextResponse.json(await createSite({ companyId: user.companyId, ...body }), { status: 201 }),
);
