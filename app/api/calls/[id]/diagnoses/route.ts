// POST /api/calls/{id}/diagnoses – starts a diagnosis on a published tree version; answers with its first step.
import { routeOf } from '@/lib/server/operation';
import { startDiagnosisOp } from '@/lib/server/operations/diagnoses';

export const POST = routeOf(startDiagnosisOp, { params: { id: 'callId' }, status: 201 });
