// GET /api/units – the company's units; POST /api/units – adds one to a site.
import { NextResponse } from 'next/server';
import { createUnit, listUnits } from '@/db/units';
import { route } from '@/lib/server/guard';
import { FIELD_ROLES } from '@/lib/roles';
import { unitSchema } from '@/lib/validations/field';

export const dynamic = 'force-dynamic';

export const GET = route({ roles: FIELD_ROLES }, async ({ user }) => listUnits({ companyId: user.companyId }));

export const POST = route({ roles: FIELD_ROLES, body: unitSchema }, async ({ user, body }) =>
  NextResponse.json(await createUnit({ companyId: user.companyId, input: body }), { status: 201 }),
);
