// GET /api/calls/{id} – a call with its unit and diagnoses.
import { route } from '@/lib/server/guard';
import { getCallDetail } from '@/lib/server/calls';
import { viewerOf } from '@/lib/server/viewer';

export const dynamic = 'force-dynamic';

export const GET = route({ roles: 'any' }, async ({ user, params }) => {
  const { call, unit, diagnoses } = await getCallDetail({ viewer: viewerOf(user), id: params.id });
  return {
    ...call,
    unit,
    diagnoses: diagnoses.map((d) => ({
      id: d.id,
      status: d.status,
      treeVersionId: d.treeVersionId,
      findingStepId: d.findingStepId,
      startedBy: d.userName,
      startedAt: d.startedAt,
      signedOffBy: d.signedOffByName,
    })),
  };
});
