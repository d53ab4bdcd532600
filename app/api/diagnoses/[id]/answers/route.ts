// POST /api/diagnoses/{id}/answers – saves the answer to the current step (idempotent by clientId).
import { route } from '@/lib/server/guard';
import { answerDiagnosis } from '@/lib/server/diagnoses';
import { viewerOf } from '@/lib/server/viewer';
import { answerSchema } from '@/lib/validations/field';

export const POST = route({ roles: 'any', body: answerSchema }, async ({ user, params, body }) =>
  answerDiagnosis({ viewer: viewerOf(user), id: params.id, input: body }),
);
