// GET /api/units/{id} – a unit with its readings history and its calls.
import { route } from '@/lib/server/guard';
import { FIELD_ROLES } from '@/lib/roles';
import { getUnitWithHistory } from '@/lib/server/calls';
import { viewerOf } from '@/lib/server/viewer';

export const dynamic = 'force-dynamic';

export const GET = route({ roles: FIELD_ROLES }, async ({ user, params }) => {
  const { unit, readings, calls } = await getUnitWithHistory({ viewer: viewerOf(user), id: params.id });
  return {
    ...unit,
    readings,
    calls: calls.map((c) => ({
      id: c.id,
      complaint: c.complaint,
      status: c.status,
      openedAt: c.openedAt,
      technicianName: c.technicianName,
    })),
  };
});
