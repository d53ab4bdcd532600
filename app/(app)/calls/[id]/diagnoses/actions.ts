'use server';

import { actionOf } from '@/lib/server/operation';
import { answerDiagnosisOp, escalateDiagnosisOp, undoAnswerOp } from '@/lib/server/operations/diagnoses';

// The wizard keeps its own state: a save answers with what it needs, so no page is revalidated.
export const submitAnswerAction = actionOf(answerDiagnosisOp);

export const undoAnswerAction = actionOf(undoAnswerOp);

export const escalateAction = actionOf(escalateDiagnosisOp, { revalidate: (_, out) => ['/', `/calls/${out.callId}`] });
