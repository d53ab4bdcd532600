// GET /api/diagnoses/{id} – where a diagnosis stands: its path, current step, finding.
import { route } from '@/lib/server/guard';
import { getDiagnosisView } from '@/lib/server/diagnoses';
import { viewerOf } from '@/lib/server/viewer';

export const dynamic = 'force-dynamic';

export const GET = route({ roles: 'any' }, async ({ user, params }) => getDiagnosisView({ viewer: viewerOf(user), id: params.id }));
