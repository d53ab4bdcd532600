// DELETE /api/diagnoses/{id}/answers/last – undoes the last answer (kept on record, off the path).
import { route } from '@/lib/server/guard';
import { undoLastAnswer } from '@/lib/server/diagnoses';
import { viewerOf } from '@/lib/server/viewer';

export const DELETE = route({ roles: 'any' }, async ({ user, params }) => undoLastAnswer({ viewer: viewerOf(user), id: params.id }));
