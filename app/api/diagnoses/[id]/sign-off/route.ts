// POST /api/diagnoses/{id}/sign-off – a technician, lead or admin signs off an apprentice's finding.
import { route } from '@/lib/server/guard';
import { signOff } from '@/lib/server/calls';
import { getDiagnosisView } from '@/lib/server/diagnoses';
import { viewerOf } from '@/lib/server/viewer';

export const POST = route({ roles: ['technician', 'lead', 'admin'] }, async ({ user, params }) => {
  await signOff({ viewer: viewerOf(user), diagnosisId: params.id });
  return getDiagnosisView({ viewer: viewerOf(user), id: params.id });
});
