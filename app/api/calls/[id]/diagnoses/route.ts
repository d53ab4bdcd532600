// POST /api/calls/{id}/diagnoses – starts a diagnosis on a published tree version; answers its first step.
import { NextResponse } from 'next/server';
import { route } from '@/lib/server/guard';
import { startDiagnosis } from '@/lib/server/diagnoses';
import { viewerOf } from '@/lib/server/viewer';
import { startDiagnosisSchema } from '@/lib/validations/field';

export const POST = route({ roles: 'any', body: startDiagnosisSchema }, async ({ user, params, body }) =>
  NextResponse.json(await startDiagnosis({ viewer: viewerOf(user), callId: params.id, treeVersionId: body.treeVersionId }), {
    status: 201,
  }),
);
