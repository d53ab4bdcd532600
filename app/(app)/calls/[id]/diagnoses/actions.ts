'use server';

import { revalidatePath } from 'next/cache';
import { z } from 'zod';
import { AppError } from '@/lib/errors';
import { answerDiagnosis, undoLastAnswer, type AnswerResult } from '@/lib/server/diagnoses';
import { action } from '@/lib/server/guard';
import { viewerOf } from '@/lib/server/viewer';
import { answerSchema } from '@/lib/validations/field';

const FIELD_ROLES = ['apprentice', 'technician', 'lead', 'admin'] as const;

const submitAnswerSchema = z.object({ diagnosisId: z.uuid({ error: 'diagnosisId must be a diagnosis id.' }), answer: answerSchema });
const undoAnswerSchema = z.object({ diagnosisId: z.uuid({ error: 'diagnosisId must be a diagnosis id.' }) });

/**
 * The wizard tells apart an answer the server refuses (roll back to its step), a diagnosis someone
 * else moved (reload), and a failure worth retrying (the action itself fails); so refusals and
 * conflicts come back as data rather than as errors.
 */
export type SubmitAnswerOutcome =
  { type: 'saved'; result: AnswerResult } | { type: 'refused'; message: string } | { type: 'conflict'; message: string };

export const submitAnswerAction = action(
  { roles: FIELD_ROLES, schema: submitAnswerSchema },
  async ({ user, input }): Promise<SubmitAnswerOutcome> => {
    try {
      const result = await answerDiagnosis({ viewer: viewerOf(user), id: input.diagnosisId, input: input.answer });
      revalidatePath('/calls', 'layout');
      return { type: 'saved', result };
    } catch (error) {
      if (error instanceof AppError && error.code === 'conflict') return { type: 'conflict', message: error.message };
      if (error instanceof AppError && (error.code === 'bad_request' || error.code === 'not_found'))
        return { type: 'refused', message: error.message };
      throw error;
    }
  },
);

export const undoAnswerAction = action({ roles: FIELD_ROLES, schema: undoAnswerSchema }, async ({ user, input }) => {
  const view = await undoLastAnswer({ viewer: viewerOf(user), id: input.diagnosisId });
  revalidatePath('/calls', 'layout');
  return view;
});
