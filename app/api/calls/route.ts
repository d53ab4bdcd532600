// GET /api/calls?status=&technician= – the calls the user may see; POST /api/calls – opens one.
import { NextResponse } from 'next/server';
import { parseOrThrow, route } from '@/lib/server/guard';
import { findCalls, openCall } from '@/lib/server/calls';
import { viewerOf } from '@/lib/server/viewer';
import { callFilterSchema, callSchema } from '@/lib/validations/field';

export const dynamic = 'force-dynamic';

export const GET = route({ roles: 'any' }, async ({ user, request }) => {
  const search = Object.fromEntries(new URL(request.url).searchParams);
  const filter = parseOrThrow(
    callFilterSchema,
    {
      status: search.status || undefined,
      technician: search.technician || undefined,
    },
    'The filter',
  );
  return findCalls({ viewer: viewerOf(user), ...filter });
});

export const POST = route({ roles: 'any', body: callSchema }, async ({ user, body }) =>
  NextResponse.json(await openCall({ viewer: viewerOf(user), input: body }), { status: 201 }),
);
