'use server';

import { actionOf } from '@/lib/server/operation';
import {
  answerAttemptOp,
  assignScenarioOp,
  createScenarioOp,
  finishAttemptOp,
  startAttemptOp,
  undoAttemptAnswerOp,
} from '@/lib/server/operations/practice';

export const createScenarioAction = actionOf(createScenarioOp, { revalidate: () => ['/practice', '/'] });

export const assignScenarioAction = actionOf(assignScenarioOp, { revalidate: (input) => [`/practice/scenarios/${input.id}`, '/practice'] });

export const startAttemptAction = actionOf(startAttemptOp, { revalidate: () => ['/practice'] });

export const finishAttemptAction = actionOf(finishAttemptOp, {
  revalidate: (input) => [`/practice/attempts/${input.id}`, '/practice', '/'],
});

// The walk's answers: a finding ends the attempt, so the practice pages and home show the score.
export const practiceAnswerAction = actionOf(answerAttemptOp, {
  revalidate: (input) => [`/practice/attempts/${input.id}`, '/practice', '/'],
});

export const practiceUndoAction = actionOf(undoAttemptAnswerOp, { revalidate: (input) => [`/practice/attempts/${input.id}`] });
