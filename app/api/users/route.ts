// GET /api/users – the company's users; POST /api/users – adds one. Admin only.
import { NextResponse } from 'next/server';
import { route } from '@/lib/server/guard';
import { addCompanyUser, listCompanyUsers } from '@/lib/server/users';
import { createUserSchema } from '@/lib/validations/users';

export const dynamic = 'force-dynamic';

export const GET = route({ roles: ['admin'] }, async ({ user }) => listCompanyUsers({ admin: user }));

export const POST = route({ roles: ['admin'], body: createUserSchema }, async ({ user, body }) =>
  NextResponse.json(await addCompanyUser({ admin: user, input: body }), { status: 201 }),
);
